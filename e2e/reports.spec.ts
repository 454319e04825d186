// Reports: a lead opens today's report after a few orders, reads the numbers, sorts and searches
// the ticket history, and downloads it as CSV (a customer named "=cmd" stays text).
import { readFile } from 'node:fs/promises';
import { request as apiRequest, type APIRequestContext } from '@playwright/test';
import { DEMO_PASSWORD, errorsOf, expect, pageAs, test } from './fixtures';
import { shot } from './shots';

async function apiAs(baseURL: string, username: string): Promise<APIRequestContext> {
  const api = await apiRequest.newContext({ baseURL });
  expect((await api.post('/api/session', { data: { username, password: DEMO_PASSWORD } })).status()).toBe(200);
  return api;
}

async function order(api: APIRequestContext, customerName: string, items: { item: string; milk?: string }[]) {
  const menu = await (await api.get('/api/menu')).json();
  const lines = items.map(({ item, milk }) => ({
    menuItemId: menu.items.find((i: { name: string }) => i.name === item).id,
    milkId: milk ? menu.milks.find((m: { name: string }) => m.name === milk).id : undefined,
  }));
  const res = await api.post('/api/orders', {
    data: { clientOrderId: crypto.randomUUID(), customerName, items: lines, payment: { method: 'cash', tenderedCents: 5_000 } },
  });
  expect(res.status()).toBe(201);
  return (await res.json()).order as { id: number; number: number };
}

test("a lead reads today's report, sorts the tickets and downloads them as CSV", async ({ browser, baseURL }) => {
  const cashier = await apiAs(baseURL!, 'cashier');
  const barista = await apiAs(baseURL!, 'barista');
  const rowan = await order(cashier, 'Rowan Reportwell', [{ item: 'Latte', milk: 'Oat' }, { item: 'Banana bread' }]);
  await order(cashier, 'Sable Reportwell', [{ item: 'Flat white' }]);
  await order(cashier, '=cmd', [{ item: 'Bottled water' }]);
  expect((await barista.post(`/api/tickets/${rowan.id}/bump`)).status()).toBe(200);
  await cashier.dispose();
  await barista.dispose();

  const page = await pageAs(browser, 'lead', '/reports', { width: 1600, height: 1000 });
  await expect(page.getByRole('heading', { name: 'Reports', level: 1 })).toBeVisible();
  await expect(page.getByTestId('period-title')).toContainText('Today');
  expect(Number((await page.getByTestId('tile-orders').locator('dd').first().textContent())!.replace(/,/g, ''))).toBeGreaterThanOrEqual(3);
  await expect(page.getByTestId('tile-net')).toContainText('$');
  // the waits in café words; the statistics' method only in the help note
  await expect(page.getByTestId('waits-words')).toContainText(/Half of the tickets waited under \d+:\d\d; 9 in 10 under \d+:\d\d\./);
  await expect(page.getByTestId('percentile-method')).not.toBeVisible();
  await page.getByText('How the waits are worked out').click();
  await expect(page.getByTestId('percentile-method')).toContainText('Hyndman & Fan type 7');
  await expect(page.getByTestId('milk-used')).toContainText('Oat');
  await expect(page.getByTestId('milk-used')).toContainText(' L');
  const rows = page.getByTestId('ticket-row');
  await expect(rows.filter({ hasText: 'Rowan Reportwell' })).toHaveCount(1);
  await expect(rows.filter({ hasText: 'Sable Reportwell' })).toHaveCount(1);

  // Sort by customer: the server sorts, the URL says so, the header says so
  const table = page.getByTestId('ticket-table');
  await table.getByRole('button', { name: /^Customer/ }).click();
  await expect(page).toHaveURL(/sort=customer&dir=asc/);
  await expect(table.getByRole('columnheader', { name: /Customer/ })).toHaveAttribute('aria-sort', 'ascending');
  const names = (await rows.locator('td:nth-child(2)').allTextContents()).map((n) => n.toLowerCase());
  expect(names).toEqual([...names].sort());
  await table.getByRole('button', { name: /^Customer/ }).click();
  await expect(page).toHaveURL(/sort=customer&dir=desc/);
  await expect(table.getByRole('columnheader', { name: /Customer/ })).toHaveAttribute('aria-sort', 'descending');
  // The sort lives in the URL: a reload is rendered on the server in the same order
  const before = await rows.locator('td:nth-child(2)').allTextContents();
  await page.reload();
  await expect(table.getByRole('columnheader', { name: /Customer/ })).toHaveAttribute('aria-sort', 'descending');
  expect(await rows.locator('td:nth-child(2)').allTextContents()).toEqual(before);

  // Search by name, through the server
  await page.getByRole('searchbox', { name: 'Search' }).fill('reportwell');
  await expect(page).toHaveURL(/q=reportwell/);
  await expect(rows).toHaveCount(2);
  await expect(page.getByTestId('ticket-count')).toContainText('of 2 tickets');
  await page.getByRole('searchbox', { name: 'Search' }).fill('');
  await expect(page).not.toHaveURL(/q=/);
  await page.getByRole('searchbox', { name: 'Search' }).blur();

  await page.screenshot(shot('reports', { fullPage: true }));

  // The CSV download: a header row first, and "=cmd" written as text
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('tickets-csv').click()]);
  expect(download.suggestedFilename()).toMatch(/^jugline-tickets-\d{4}-\d{2}-\d{2}_to_\d{4}-\d{2}-\d{2}\.csv$/);
  const csv = await readFile((await download.path())!, 'utf8');
  expect(csv.startsWith('"Date","Ticket","Customer","Status"')).toBe(true);
  expect(csv).toContain(`"'=cmd"`);
  expect(csv).toContain('"Rowan Reportwell"');
  expect(errorsOf(page)).toEqual([]);
});

test('a cashier who opens Reports gets the 403 screen', async ({ browser }) => {
  const page = await pageAs(browser, 'cashier', '/counter', { width: 1280, height: 900 });
  const res = await page.goto('/reports');
  expect(res?.status()).toBe(403);
  await expect(page.getByRole('heading', { name: 'Not your screen' })).toBeVisible();
});
