// Reports day by day: a lead picks the last seven days, today included, sees a row per date with
// today's order count as the day's own report says it, and the range's total; downloads the days
// as CSV; on a phone the table scrolls in its own box. Today alone shows no day-by-day table, and
// a range past a year says it is too long for one.
import { readFile } from 'node:fs/promises';
import AxeBuilder from '@axe-core/playwright';
import { expect, errorsOf, apiAs, pageAs, test } from './fixtures';
import { shot } from './shots';

/** YYYY-MM-DD `n` days before `date`. */
const daysBefore = (date: string, n: number) => new Date(Date.parse(`${date}T00:00:00Z`) - n * 86_400_000).toISOString().slice(0, 10);

test('a lead reads a week day by day, with today’s orders, and downloads it as CSV', async ({ browser, baseURL }) => {
  const cashier = await apiAs(baseURL!, 'cashier');
  const barista = await apiAs(baseURL!, 'barista');
  const menu = await (await cashier.get('/api/menu')).json();
  const latte = menu.items.find((i: { name: string }) => i.name === 'Latte').id;
  for (const customerName of ['Nell Daybyday', 'Otto Daybyday']) {
    const res = await cashier.post('/api/orders', {
      data: { clientOrderId: crypto.randomUUID(), customerName, items: [{ menuItemId: latte }], payment: { method: 'cash', tenderedCents: 5_000 } },
    });
    expect(res.status()).toBe(201);
    if (customerName.startsWith('Nell')) expect((await barista.post(`/api/tickets/${(await res.json()).order.id}/bump`)).status()).toBe(200);
  }
  await cashier.dispose();
  await barista.dispose();

  // other specs of the run may have orders today too: the day's own report says how many
  const lead = await apiAs(baseURL!, 'lead');
  const today = (await (await lead.get('/api/reports/shifts')).json()).today as string;
  const from = daysBefore(today, 6);
  const todays = (await (await lead.get(`/api/reports/range?from=${today}&to=${today}`)).json()).orders as number;
  const week = (await (await lead.get(`/api/reports/range?from=${from}&to=${today}`)).json()).orders as number;
  await lead.dispose();
  expect(todays).toBeGreaterThanOrEqual(2);

  const page = await pageAs(browser, 'lead', '/reports', { width: 1366, height: 900 });
  // today alone is one day: no day-by-day table
  await expect(page.getByTestId('tile-orders')).toBeVisible();
  await expect(page.getByTestId('report-days')).toHaveCount(0);

  await page.getByLabel('From', { exact: true }).fill(from);
  await page.getByLabel('To', { exact: true }).fill(today);
  await page.getByRole('button', { name: 'Show dates' }).click();
  await expect(page).toHaveURL(new RegExp(`from=${from}&to=${today}`));
  await expect(page.getByRole('heading', { name: 'Day by day' })).toBeVisible();
  const rows = page.getByTestId('report-day');
  await expect(rows).toHaveCount(7);
  await expect(rows.first()).toHaveAttribute('data-date', from);
  const todayRow = rows.last();
  await expect(todayRow).toHaveAttribute('data-date', today);
  await expect(todayRow.getByTestId('day-orders')).toHaveText(String(todays));
  await expect(page.getByTestId('days-total')).toContainText('All 7 days');
  await expect(page.getByTestId('days-total').locator('td').first()).toHaveText(week.toLocaleString('en-US'));
  await expect(page.getByRole('columnheader', { name: 'Half waited under' })).toBeVisible();
  await expect(page.getByRole('columnheader', { name: 'Net revenue' })).toBeVisible();
  // no tips in the range: no Tips column (e2e/tips.spec.ts has one)
  await expect(page.getByRole('columnheader', { name: 'Tips' })).toHaveCount(0);
  // the section at the top of the window, so the picture holds the whole table and its total
  const toSection = () => page.getByRole('heading', { name: 'Day by day' }).evaluate((h) => h.scrollIntoView({ block: 'start' }));
  await toSection();
  await page.screenshot(shot('report-days'));
  // the new section alone against WCAG 2.1 AA (a11y-axe.spec.ts opens Reports for today, without it)
  const axe = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).include('[aria-labelledby="panel-day-by-day"]').analyze();
  expect(axe.violations.map((v) => `${v.impact} ${v.id}: ${v.help}`)).toEqual([]);

  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('days-csv').click()]);
  expect(download.suggestedFilename()).toBe(`jugline-days-${from}_to_${today}.csv`);
  const lines = (await readFile((await download.path())!, 'utf8')).trim().split('\r\n');
  expect(lines[0].startsWith('"Date","Orders","Drinks","Gross (USD)","Tax (USD)","Discounts (USD)","Refunds (USD)","Net (USD)"')).toBe(true);
  expect(lines[0]).toMatch(/"Median wait \(s\)","p90 wait \(s\)","Over \d+ s target","Tickets timed","Shots pulled"$/);
  expect(lines[0]).toContain('"Card (USD)","Tips (USD)","Cash tips (USD)","Card tips (USD)"');
  expect(lines).toHaveLength(1 + 7 + 1);
  expect(lines[7].startsWith(`"${today}","${todays}",`)).toBe(true);
  expect(lines[8].startsWith(`"Total","${week}",`)).toBe(true);
  expect(errorsOf(page)).toEqual([]);

  // on a phone the table scrolls in its own named box, never the page
  await page.setViewportSize({ width: 390, height: 844 });
  await expect(page.getByRole('region', { name: 'Day by day table' })).toBeVisible();
  expect(await page.evaluate(() => document.documentElement.scrollWidth <= document.documentElement.clientWidth)).toBe(true);
  await toSection();
  await page.screenshot(shot('report-days-phone'));

  // past a year the range is shown whole, and the page says why there are no days
  await page.goto(`/reports?from=${daysBefore(today, 400)}&to=${today}`);
  await expect(page.getByTestId('days-too-long')).toContainText('at most 366 days');
  await expect(page.getByTestId('report-days')).toHaveCount(0);
  await expect(page.getByTestId('tile-orders')).toBeVisible();
  expect(errorsOf(page)).toEqual([]);
});
