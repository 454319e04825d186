// Playwright fixtures: a signed-in page per role, and a check that no page logs an error.
import { request, test as base, expect, type Browser, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'jugline-demo';
export type Login = 'owner' | 'lead' | 'cashier' | 'barista' | 'barista2';

/** Sign in through the real form, as a person would. */
export async function signIn(page: Page, login: Login, next?: string) {
  await page.goto(next ? `/signin?next=${encodeURIComponent(next)}` : '/signin');
  await expect(page.getByRole('button', { name: 'Sign in' })).toBeEnabled(); // hydrated
  await page.getByLabel('Sign-in name').fill(login);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/** A signed-in page in a context of its own; `baseURL` for a spec's own server (e2e/own-server.ts). */
export async function pageAs(browser: Browser, login: Login, path: string, viewport = { width: 1920, height: 1080 }, baseURL?: string) {
  const context = await browser.newContext({ viewport, ...(baseURL ? { baseURL } : {}) });
  const page = await context.newPage();
  watchForErrors(page);
  await signIn(page, login, path);
  await page.waitForURL(`**${path}`);
  return page;
}

/** A signed-in API client for setting the scene (orders, bumps) without a browser. */
export async function apiAs(baseURL: string, login: Login) {
  const ctx = await request.newContext({ baseURL });
  await ctx.post('/api/session', { data: { username: login, password: DEMO_PASSWORD } });
  return ctx;
}

const pageErrors = new WeakMap<Page, string[]>();
export function watchForErrors(page: Page) {
  const errors: string[] = [];
  pageErrors.set(page, errors);
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(m.text());
  });
}
export const errorsOf = (page: Page) => pageErrors.get(page) ?? [];

export const test = base;
export { expect };

/** The widths every screen is tried at: a phone, a tablet upright and on its side, a small laptop, a desktop. */
export const WIDTHS = [
  { width: 390, height: 844 },
  { width: 768, height: 1024 },
  { width: 1024, height: 768 },
  { width: 1366, height: 768 },
  { width: 1920, height: 1080 },
] as const;
