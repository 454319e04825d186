// Every screen with the person who opens it and a café in service behind it (orders queued, one
// ready, one with an allergy, a shift open, a receipt and a reset link mailed), for the
// accessibility and widths specs. One signed-in browser context per role, reused across screens.
import { request as apiRequest, type APIRequestContext, type Browser, type BrowserContext, type Page } from '@playwright/test';
import { SCREENS } from '@/domain/screens';
import { DEMO_PASSWORD, expect, test, watchForErrors, type Login } from './fixtures';

export interface ScreenCase {
  /** Names the test and the screenshot file. */
  name: string;
  path: string;
  /** null: signed out. */
  as: Login | null;
}

export interface Service {
  /** The allergy order: its receipt and cup labels are the ones shown. */
  allergyOrderId: number;
  welcomeToken: string;
  close(): Promise<void>;
}

async function apiAs(baseURL: string, login: Login): Promise<APIRequestContext> {
  const api = await apiRequest.newContext({ baseURL });
  expect((await api.post('/api/session', { data: { username: login, password: DEMO_PASSWORD } })).status()).toBe(200);
  return api;
}

type Line = { item: string; milk?: string };
async function order(api: APIRequestContext, customerName: string, items: Line[], extra: object = {}) {
  const menu = await (await api.get('/api/menu')).json();
  const lines = items.map(({ item, milk }) => ({
    menuItemId: menu.items.find((i: { name: string }) => i.name === item).id,
    milkId: milk ? menu.milks.find((m: { name: string }) => m.name === milk).id : undefined,
  }));
  const res = await api.post('/api/orders', {
    data: { clientOrderId: crypto.randomUUID(), customerName, items: lines, payment: { method: 'cash', tenderedCents: 10_000 }, ...extra },
  });
  expect(res.status()).toBe(201);
  return (await res.json()).order as { id: number; number: number };
}

/**
 * Puts the café in service. `close()` closes the shift it opened, so a later spec (Pulse) finds
 * the shift closed as the seed left it.
 */
export async function inService(baseURL: string): Promise<Service> {
  const lead = await apiAs(baseURL, 'lead');
  const opened = await lead.post('/api/shifts', { data: { openingFloatCents: 15_000, baristasOnBar: 2, waitTargetSeconds: 240 } });
  expect([201, 200, 409]).toContain(opened.status()); // 409: one is already open, which serves as well
  const ownShift = opened.ok();

  const cashier = await apiAs(baseURL, 'cashier');
  const ready = await order(cashier, 'Hollis Penrose', [{ item: 'Flat white', milk: 'Whole' }]);
  const allergy = await order(cashier, 'Marisol Quintero-Abernathy', [{ item: 'Latte', milk: 'Oat' }, { item: 'Banana bread' }], {
    allergens: ['peanuts'],
    allergyNote: 'carries an auto-injector',
    customerEmail: 'marisol@example.com',
  });
  await order(cashier, 'Tobias Wren', [{ item: 'Cappuccino', milk: 'Whole' }, { item: 'Mocha', milk: 'Soy' }, { item: 'Espresso' }]);
  await order(cashier, 'Ada Lindqvist', [{ item: 'Latte', milk: 'Almond' }, { item: 'Long black' }]);
  expect((await cashier.post(`/api/orders/${allergy.id}/receipt`, { data: { email: 'marisol@example.com' } })).status()).toBe(202);

  const barista = await apiAs(baseURL, 'barista');
  expect((await barista.post(`/api/tickets/${ready.id}/bump`)).status()).toBe(200);

  // a reset link for the owner (the only demo person with an e-mail): the welcome screen's token
  const owner = await apiAs(baseURL, 'owner');
  const team = await (await owner.get('/api/team')).json();
  const mara = team.members.find((p: { username: string }) => p.username === 'owner');
  expect((await owner.post(`/api/team/${mara.id}/link`, { data: { purpose: 'reset' } })).status()).toBe(202);
  const outbox = await (await owner.get('/api/outbox')).json();
  const token = JSON.stringify(outbox.mails).match(/\/welcome\/([A-Za-z0-9_-]{43})/)?.[1];
  expect(token, 'a reset link in the outbox').toBeDefined();

  return {
    allergyOrderId: allergy.id,
    welcomeToken: token!,
    close: async () => {
      if (ownShift) {
        // the service left tickets at the bar on purpose: the lead confirms closing over them
        const closed = await lead.post('/api/shifts/current/close', { data: { countedCashCents: 15_000, confirmOpenTickets: true } });
        expect(closed.ok(), await closed.text()).toBe(true);
      }
      for (const api of [lead, cashier, barista, owner]) await api.dispose();
    },
  };
}

/** Every screen in the screens table (plus sign-in, welcome and the not-found page), with who opens it. */
export function screenCases(service: Service): ScreenCase[] {
  const who: Record<keyof typeof SCREENS, Login> = {
    counter: 'cashier',
    bar: 'barista',
    pickup: 'cashier',
    pulse: 'lead',
    reports: 'lead',
    cardCheck: 'lead',
    outbox: 'owner',
    receipt: 'cashier',
    labels: 'cashier',
    adminMenu: 'owner',
    adminTeam: 'owner',
    adminBeans: 'owner',
    adminSettings: 'owner',
    dialIn: 'barista',
  };
  const listed = (Object.keys(SCREENS) as (keyof typeof SCREENS)[]).map((id) => ({
    name: SCREENS[id].label.toLowerCase().replace(/\s+/g, '-'),
    path: SCREENS[id].path.replace(':id', String(service.allergyOrderId)),
    as: who[id],
  }));
  return [
    { name: 'sign-in', path: '/signin', as: null },
    { name: 'welcome', path: `/welcome/${service.welcomeToken}`, as: null },
    ...listed,
    { name: 'not-found', path: '/no-such-screen', as: 'cashier' },
  ];
}

/** One browser context per person (and one signed out), signed in once through the API. */
export class Contexts {
  private made = new Map<string, BrowserContext>();
  constructor(
    private browser: Browser,
    private baseURL: string,
  ) {}

  async of(login: Login | null): Promise<BrowserContext> {
    const key = login ?? 'anon';
    let context = this.made.get(key);
    if (!context) {
      context = await this.browser.newContext({ baseURL: this.baseURL, viewport: { width: 1366, height: 900 } });
      if (login) expect((await context.request.post('/api/session', { data: { username: login, password: DEMO_PASSWORD } })).status()).toBe(200);
      this.made.set(key, context);
    }
    return context;
  }

  async page(login: Login | null): Promise<Page> {
    const page = await (await this.of(login)).newPage();
    watchForErrors(page);
    return page;
  }

  async close() {
    for (const c of this.made.values()) await c.close();
  }
}

/** Opens a screen and waits until React has hydrated it. */
export async function open(page: Page, path: string) {
  const res = await page.goto(path);
  expect(res?.status(), path).toBeLessThan(path === '/no-such-screen' ? 500 : 400);
  await expect(page.locator('html[data-hydrated]')).toHaveCount(1);
}

/** The screens' names, known before the café is in service (tests are declared before it runs). */
export const SCREEN_NAMES = screenCases({ allergyOrderId: 0, welcomeToken: '', close: async () => {} }).map((s) => s.name);

/**
 * For a spec file: the café put in service once before its tests and one context per person;
 * both closed after. Read `suite.service` and `suite.contexts` inside a test.
 */
export function screenSuite() {
  const suite = {} as { service: Service; contexts: Contexts; screen(name: string): ScreenCase };
  suite.screen = (name) => screenCases(suite.service).find((s) => s.name === name)!;
  test.beforeAll(async ({ browser }, info) => {
    const baseURL = info.project.use.baseURL!;
    suite.service = await inService(baseURL);
    suite.contexts = new Contexts(browser, baseURL);
  });
  test.afterAll(async () => {
    await suite.contexts?.close();
    await suite.service?.close();
  });
  return suite;
}
