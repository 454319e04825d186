// The reported sequence at the Bar: jug 1 (a flat white) is started, then a cappuccino arrives.
// Jug 1 still holds only the flat white, the cappuccino is jug 2, and "Bump jug 1" bumps only the
// flat white. Then the owner's Settings warn about a fill line at the brim. On a server of its
// own, so no earlier spec's tickets share the lane.
import { request as apiRequest, type Browser, type Page } from '@playwright/test';
import { DEMO_PASSWORD, errorsOf, expect, signIn, test, watchForErrors, type Login } from './fixtures';
import { shot } from './shots';
import { OwnServer } from './own-server';

let own: OwnServer;
test.beforeAll(async () => {
  own = await OwnServer.create('jug-plan');
  await own.start();
});
test.afterAll(() => own?.dispose());

async function pageOn(browser: Browser, login: Login, at: string, viewport = { width: 1920, height: 1080 }) {
  const context = await browser.newContext({ baseURL: own.baseURL, viewport });
  const page = await context.newPage();
  watchForErrors(page);
  await signIn(page, login, at);
  await page.waitForURL(`**${at}`);
  return page;
}

async function orderWhole(item: string, customerName: string) {
  const api = await apiRequest.newContext({ baseURL: own.baseURL });
  await api.post('/api/session', { data: { username: 'cashier', password: DEMO_PASSWORD } });
  const menu = await (await api.get('/api/menu')).json();
  const menuItemId = menu.items.find((i: { name: string }) => i.name === item).id;
  const milkId = menu.milks.find((m: { name: string }) => m.name === 'Whole').id;
  const res = await api.post('/api/orders', {
    data: { clientOrderId: crypto.randomUUID(), customerName, items: [{ menuItemId, milkId }], payment: { method: 'cash', tenderedCents: 10_000 } },
  });
  expect(res.status()).toBe(201);
  await api.dispose();
}

const laneOf = (page: Page, milk: string) => page.getByTestId('lane').filter({ has: page.getByRole('heading', { name: milk }) });
const cardOf = (page: Page, name: string) => page.getByTestId('drink-card').filter({ hasText: name });

test('a started jug keeps its drinks when a newer one arrives; "Bump jug 1" bumps only them', async ({ browser }) => {
  test.setTimeout(120_000);
  const bar = await pageOn(browser, 'barista', '/bar');
  const other = await pageOn(browser, 'barista2', '/bar');
  for (const p of [bar, other]) await expect(p.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();

  // A flat white: 120 ml + 15 ml waste = 135 ml → the 350 ml pitcher (fill line 190, minimum 120).
  // The demo café reads US fl oz (1 oz = 29.5735 ml): 350 ml ≈ 11.8 → a 12 oz pitcher (whole
  // ounces), 135 ml ≈ 4.6 → 4.5 oz and 15 ml ≈ 0.5 oz (half ounces, src/domain/units.ts).
  await orderWhole('Flat white', 'Nell Avery');
  const whole = laneOf(bar, 'Whole');
  const jugs = whole.getByTestId('jug');
  await expect(jugs).toHaveCount(1);
  await expect(jugs.first()).toContainText('Jug 1: 12 oz pitcher · fill to 4.5 oz (0.5 oz waste) · 1 drink · short stretch (wet)');
  await whole.getByRole('button', { name: 'Start jug 1' }).click();
  await expect(jugs.first()).toHaveAttribute('data-jug-state', 'started');
  await expect(jugs.first()).toContainText('Jug 1 · started: 12 oz pitcher · fill to 4.5 oz');
  await expect(cardOf(bar, 'Nell Avery')).toContainText('Making');

  // A cappuccino arrives: 210 + 15 = 225 ml, foamy → the 600 ml pitcher (≈ 20.3 → 20 oz; 225 ml ≈
  // 7.6 → 7.5 oz). It is jug 2.
  await orderWhole('Cappuccino', 'Otis Crane');
  await expect(cardOf(bar, 'Otis Crane')).toBeVisible();
  await expect(jugs).toHaveCount(2);
  await expect(jugs.nth(0)).toContainText('Jug 1 · started: 12 oz pitcher · fill to 4.5 oz (0.5 oz waste) · 1 drink · short stretch (wet)');
  await expect(jugs.nth(1)).toHaveAttribute('data-jug-state', 'planned');
  await expect(jugs.nth(1)).toContainText('Jug 2: 20 oz pitcher · fill to 7.5 oz (0.5 oz waste) · 1 drink · long stretch (dry)');
  await expect(cardOf(bar, 'Nell Avery')).toContainText('Jug 1 · pour 1st');
  await expect(cardOf(bar, 'Otis Crane')).toContainText('Jug 2 · pour 1st');
  // the other screen shows the same, from the live events alone
  await expect(laneOf(other, 'Whole').getByTestId('jug').nth(1)).toContainText('Jug 2: 20 oz pitcher');
  await bar.screenshot(shot('jug-plan-started-jug-and-newcomer'));

  await whole.getByRole('button', { name: 'Bump jug 1' }).click();
  await expect(cardOf(bar, 'Nell Avery')).toHaveCount(0);
  await expect(cardOf(other, 'Nell Avery')).toHaveCount(0);
  await expect(cardOf(bar, 'Otis Crane')).toContainText('Start');
  await expect(jugs).toHaveCount(1);
  await expect(jugs.first()).toHaveAttribute('data-jug-state', 'planned');
  await expect(jugs.first()).toContainText('Jug 1: 20 oz pitcher · fill to 7.5 oz');
  await bar.screenshot(shot('jug-plan-after-bump-jug-1'));

  for (const page of [bar, other]) expect(errorsOf(page)).toEqual([]);
});

test('Settings: the jug rules, and a warning for a fill line at the brim', async ({ browser }) => {
  const owner = await pageOn(browser, 'owner', '/admin/settings', { width: 1440, height: 1400 });
  await expect(owner.getByRole('button', { name: 'Save' }).first()).toBeEnabled(); // hydrated
  const barSection = owner.getByRole('form', { name: 'Bar', exact: true });
  await expect(barSection.getByLabel('Most drinks in one jug')).toHaveValue('4');
  await expect(barSection.getByLabel('Foamy (%)')).toHaveValue('75');

  const small = owner.getByRole('form', { name: 'Pitcher of 350 ml' });
  await expect(small.getByLabel('Minimum fill (ml)')).toHaveValue('120');
  await expect(small.getByTestId('fill-line-note')).toHaveCount(0);
  // Typed, not saved: the warning follows the form.
  await small.getByLabel('Fill line (ml)').fill('350');
  const warning = small.getByRole('alert');
  await expect(warning).toContainText('The fill line is the brim');
  // 350 × 100 / 175 = 200 ml for a foamy jug
  await expect(warning).toContainText('at most 200 ml for a foamy jug');
  await small.scrollIntoViewIfNeeded();
  await owner.screenshot(shot('jug-plan-settings-fill-line-warning', { fullPage: true }));
  expect(errorsOf(owner)).toEqual([]);
});
