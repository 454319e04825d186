// Tips end to end, on a server of its own (other specs must not see tips on): the owner turns tips
// on in Settings, the cashier takes a small latte with a 15 % tip paid in cash, and the receipt
// shows the tip after the total. Figures by hand: a small whole-milk latte is $4.80 + 8.25 % tax =
// $5.20 (0.396 rounds up, Streamlined Sales and Use Tax Agreement §324); 15 % of $5.20 = $0.78;
// the customer pays $5.98, and $10.00 tendered gives $4.02 change. Then the tips where the lead
// and the owner read them: Pulse's "Tips today", a Tips column in Day by day and side by side.
import AxeBuilder from '@axe-core/playwright';
import type { Page } from '@playwright/test';
import { apiAs, errorsOf, expect, pageAs, test } from './fixtures';
import { ownServerFor } from './own-server';
import { shot } from './shots';

const own = ownServerFor('tips');

test('the owner turns tips on; a 15 % tip in cash reaches the change and the receipt', async ({ browser }) => {
  const owner = await pageAs(browser, 'owner', '/admin/settings', { width: 1366, height: 900 }, own.baseURL);
  await expect(owner.getByRole('button', { name: 'Save' }).first()).toBeEnabled(); // hydrated
  const tips = owner.getByRole('form', { name: 'Tips', exact: true });
  await tips.getByLabel('Take tips at the Counter').check();
  await expect(tips.getByLabel('Suggestion 2 (%)')).toHaveValue('15');
  await tips.getByRole('button', { name: 'Save' }).click();
  await expect(tips.getByText('Saved')).toBeVisible();

  const counter = await pageAs(browser, 'cashier', '/counter', { width: 1024, height: 768 }, own.baseURL);
  await expect(counter.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  await counter.getByRole('button', { name: /^Latte/ }).click();
  await counter.getByRole('radio', { name: /Small/ }).click();
  await counter.getByRole('button', { name: /Add to order/ }).click();
  await counter.getByLabel('Name for the cup').fill('Tess Amberley');
  await expect(counter.getByTestId('order-total')).toHaveText('$5.20');
  const picker = counter.getByTestId('tip-picker');
  await expect(picker.getByRole('radio', { name: /No tip/ })).toHaveAttribute('aria-checked', 'true');
  await expect(picker.getByRole('radio', { name: /15 %/ })).toContainText('$0.78');
  // another amount first: $1.00 on top of $5.20 is $6.20 to pay; then the customer picks 15 % after all
  await picker.getByRole('radio', { name: 'Other' }).click();
  await picker.getByLabel('Tip amount').fill('1');
  await expect(counter.getByRole('button', { name: /^Send/ })).toHaveText('Send · $6.20');
  await picker.getByRole('radio', { name: /15 %/ }).click();
  await expect(picker.getByLabel('Tip amount')).toHaveCount(0);
  await counter.getByLabel(/Cash tendered/).fill('10.00');
  await expect(counter.getByTestId('change-due')).toHaveText('$4.02');
  await expect(counter.getByRole('button', { name: /^Send/ })).toHaveText('Send · $5.98');
  await counter.screenshot(shot('tips-counter'));
  await counter.getByRole('button', { name: /^Send/ }).click();
  const sent = counter.getByRole('status').filter({ hasText: /Sent #\d+ for Tess Amberley/ });
  await expect(sent).toContainText('$5.98 with $0.78 tip');
  await expect(counter.getByTestId('sent-change')).toHaveText('$4.02');

  const href = await sent.getByRole('link', { name: 'Receipt' }).getAttribute('href');
  const receipt = await pageAs(browser, 'cashier', href!, { width: 480, height: 800 }, own.baseURL);
  const totals = receipt.locator('dl');
  await expect(totals).toContainText('Total$5.20');
  await expect(totals).toContainText('Tip$0.78');
  await expect(totals).toContainText('Amount paid$5.98');
  await expect(totals).toContainText('Change$4.02');
  await receipt.screenshot(shot('tips-receipt', { fullPage: true }));

  for (const page of [owner, counter, receipt]) expect(errorsOf(page)).toEqual([]);
});

/** YYYY-MM-DD `n` days before `date`. */
const daysBefore = (date: string, n: number) => new Date(Date.parse(`${date}T00:00:00Z`) - n * 86_400_000).toISOString().slice(0, 10);
const dollars = (cents: number) => `$${(cents / 100).toFixed(2)}`;
/** The section with its Tips column against WCAG 2.1 AA. */
async function axeOf(page: Page, selector: string) {
  const axe = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).include(selector).analyze();
  expect(axe.violations.map((v) => `${v.impact} ${v.id}: ${v.help}`)).toEqual([]);
}

test('tips on Pulse, in Day by day and in the cafés side by side', async ({ browser }) => {
  test.setTimeout(60_000); // three screens on a shared machine
  const owner = await apiAs(own.baseURL, 'owner');
  expect((await owner.put('/api/settings', { data: { tipsOn: true, tipPercents: [10, 15, 20], tipCustom: true } })).status()).toBe(200);
  const cashier = await apiAs(own.baseURL, 'cashier');
  const menu = await (await cashier.get('/api/menu')).json();
  const latte = menu.items.find((i: { name: string }) => i.name === 'Latte').id;
  const res = await cashier.post('/api/orders', {
    data: {
      clientOrderId: crypto.randomUUID(),
      customerName: 'Uma Tipton',
      items: [{ menuItemId: latte }],
      payment: { method: 'cash', tenderedCents: 5_000 },
      tipCents: 125,
    },
  });
  expect(res.status(), await res.text()).toBe(201);
  await cashier.dispose();
  // the test above may have left a tip today too: the day's own report says what today's are
  const today = (await (await owner.get('/api/reports/shifts')).json()).today as string;
  const { tips } = await (await owner.get(`/api/reports/range?from=${today}&to=${today}`)).json();
  await owner.dispose();
  expect(tips.cents).toBeGreaterThanOrEqual(125);
  const tipsLine = `${dollars(tips.cents)}cash ${dollars(tips.cashCents)} · card ${dollars(tips.cardCents)}`;

  const pulse = await pageAs(browser, 'lead', '/pulse', { width: 1366, height: 768 }, own.baseURL);
  await expect(pulse.getByTestId('tips-today')).toHaveText(
    `Tips today ${dollars(tips.cents)} (cash ${dollars(tips.cashCents)} · card ${dollars(tips.cardCents)})`,
  );
  await pulse.getByRole('banner').screenshot(shot('tips-pulse'));

  const days = await pageAs(browser, 'lead', `/reports?from=${daysBefore(today, 6)}&to=${today}`, { width: 1366, height: 900 }, own.baseURL);
  const table = days.getByTestId('report-days');
  await expect(table.getByRole('columnheader', { name: 'Tips' })).toBeVisible();
  await expect(table.locator(`[data-date="${today}"]`).getByTestId('row-tips')).toHaveText(tipsLine);
  await expect(table.locator(`[data-date="${daysBefore(today, 1)}"]`).getByTestId('row-tips')).toHaveText('$0.00');
  await expect(days.getByTestId('days-total').getByTestId('row-tips')).toHaveText(tipsLine);
  await days.getByRole('heading', { name: 'Day by day' }).evaluate((h) => h.scrollIntoView({ block: 'start' }));
  await days.screenshot(shot('tips-report-days'));
  await axeOf(days, '[aria-labelledby="panel-day-by-day"]');
  // the wider table still scrolls in its own box on a phone, never the page
  await days.setViewportSize({ width: 390, height: 844 });
  expect(await days.evaluate(() => document.documentElement.scrollWidth <= document.documentElement.clientWidth)).toBe(true);
  await days.getByRole('heading', { name: 'Day by day' }).evaluate((h) => h.scrollIntoView({ block: 'start' }));
  await days.screenshot(shot('tips-report-days-phone'));

  // the owner's group: Harbour & Hearth's tips, none at Ropewalk, and the two added up
  const group = await pageAs(browser, 'owner', '/reports', { width: 1366, height: 900 }, own.baseURL);
  const side = group.getByTestId('group-report');
  await expect(side.getByRole('columnheader', { name: 'Tips' })).toBeVisible();
  await expect(side.getByTestId('group-cafe').nth(0).getByTestId('row-tips')).toHaveText(tipsLine);
  await expect(side.getByTestId('group-cafe').nth(1).getByTestId('row-tips')).toHaveText('$0.00');
  await expect(side.getByTestId('group-totals').getByTestId('row-tips')).toHaveText(tipsLine);
  await group.getByRole('heading', { name: 'Cafés side by side' }).evaluate((h) => h.scrollIntoView({ block: 'start' }));
  await group.screenshot(shot('tips-group'));
  await axeOf(group, '[data-testid="group-section"]');

  for (const page of [pulse, days, group]) expect(errorsOf(page)).toEqual([]);
});
