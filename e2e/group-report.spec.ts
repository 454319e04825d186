// The café group's report on Reports: the owner sees both demo cafés side by side for today, each
// row with its own orders (taken here through the API by each café's own cashier), and a totals
// row; a lead, who works in one café, sees no such table.
import AxeBuilder from '@axe-core/playwright';
import { request as apiRequest, type APIRequestContext } from '@playwright/test';
import { DEMO_PASSWORD, errorsOf, expect, pageAs, test } from './fixtures';
import { shot } from './shots';

const HOME = 'Harbour & Hearth Coffee';
const ROPEWALK = 'Ropewalk Coffee Bar';

async function apiAs(baseURL: string, username: string): Promise<APIRequestContext> {
  const api = await apiRequest.newContext({ baseURL });
  expect((await api.post('/api/session', { data: { username, password: DEMO_PASSWORD } })).status()).toBe(200);
  return api;
}

/** Cash orders of one Flat white each, at the café the person works in. */
async function orders(api: APIRequestContext, names: string[]) {
  const menu = await (await api.get('/api/menu')).json();
  const menuItemId = menu.items.find((i: { name: string }) => i.name === 'Flat white').id;
  const placed: { id: number }[] = [];
  for (const customerName of names) {
    const res = await api.post('/api/orders', {
      data: { clientOrderId: crypto.randomUUID(), customerName, items: [{ menuItemId }], payment: { method: 'cash', tenderedCents: 5_000 } },
    });
    expect(res.status()).toBe(201);
    placed.push((await res.json()).order);
  }
  return placed;
}

test('the owner reads both cafés side by side on Reports, with the group’s total', async ({ browser, baseURL }) => {
  // other specs of the run may already have orders today: count from what the group report says now
  const ownerApi = await apiAs(baseURL!, 'owner');
  const today = (await (await ownerApi.get('/api/reports/shifts')).json()).today as string;
  const before = await (await ownerApi.get(`/api/reports/group?from=${today}&to=${today}`)).json();
  const ordersBefore = (name: string) => before.cafes.find((c: { name: string }) => c.name === name).orders as number;

  const cashier = await apiAs(baseURL!, 'cashier');
  const rwCashier = await apiAs(baseURL!, 'rw-cashier');
  const rwBarista = await apiAs(baseURL!, 'rw-barista');
  await orders(cashier, ['Ada Sidebyside', 'Bram Sidebyside', 'Cora Sidebyside']);
  const [wren] = await orders(rwCashier, ['Wren Sidebyside', 'Gus Sidebyside']);
  expect((await rwBarista.post(`/api/tickets/${wren.id}/bump`)).status()).toBe(200);
  for (const api of [ownerApi, cashier, rwCashier, rwBarista]) await api.dispose();

  const page = await pageAs(browser, 'owner', '/reports', { width: 1366, height: 900 });
  const table = page.getByTestId('group-report');
  await expect(page.getByRole('heading', { name: 'Cafés side by side' })).toBeVisible();
  const rows = table.getByTestId('group-cafe');
  await expect(rows).toHaveCount(2);
  // oldest café first, each with its own count of today's orders
  await expect(rows.nth(0).getByRole('rowheader')).toHaveText(HOME);
  await expect(rows.nth(1).getByRole('rowheader')).toHaveText(ROPEWALK);
  await expect(rows.nth(0).getByTestId('group-orders')).toHaveText(String(ordersBefore(HOME) + 3));
  await expect(rows.nth(1).getByTestId('group-orders')).toHaveText(String(ordersBefore(ROPEWALK) + 2));
  await expect(rows.nth(1)).toContainText('1 ticket timed');
  await expect(table.getByTestId('group-totals')).toContainText(String(ordersBefore(HOME) + ordersBefore(ROPEWALK) + 5));
  await expect(table.getByTestId('group-totals')).toContainText('$');
  // the tiles below stay the café in view's own
  await expect(page.getByText(`The rest of this page is ${HOME} alone.`)).toBeVisible();
  await page.screenshot(shot('group-report', { fullPage: true }));
  // the new table alone against WCAG 2.1 AA (a11y-axe.spec.ts opens Reports as a lead, without it)
  const axe = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).include('[data-testid="group-section"]').analyze();
  expect(axe.violations.map((v) => `${v.impact} ${v.id}: ${v.help}`)).toEqual([]);
  expect(errorsOf(page)).toEqual([]);

  // on a phone the table scrolls in its own named box, never the page
  await page.setViewportSize({ width: 390, height: 844 });
  await expect(page.getByRole('region', { name: 'Cafés side by side table' })).toBeVisible();
  expect(await page.evaluate(() => document.documentElement.scrollWidth <= document.documentElement.clientWidth)).toBe(true);
  await page.getByTestId('group-report').scrollIntoViewIfNeeded();
  await page.screenshot(shot('group-report-phone'));

  // a lead works in one café: no side-by-side table
  const lead = await pageAs(browser, 'lead', '/reports', { width: 1366, height: 900 });
  await expect(lead.getByTestId('tile-orders')).toBeVisible();
  await expect(lead.getByTestId('group-report')).toHaveCount(0);
});
