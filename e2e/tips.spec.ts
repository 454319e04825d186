// Tips end to end, on a server of its own (other specs must not see tips on): the owner turns tips
// on in Settings, the cashier takes a small latte with a 15 % tip paid in cash, and the receipt
// shows the tip after the total. Figures by hand: a small whole-milk latte is $4.80 + 8.25 % tax =
// $5.20 (0.396 rounds up, Streamlined Sales and Use Tax Agreement §324); 15 % of $5.20 = $0.78;
// the customer pays $5.98, and $10.00 tendered gives $4.02 change.
import { errorsOf, expect, pageAs, test } from './fixtures';
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
