// Paying in parts at the Counter, end to end: part cash (with change), part card; a declined card
// leaves the cash part paid and nothing on the bar; another card for that part pays the rest and
// the drink reaches the bar; the receipt lists the parts, and a lead refunds one part on its own.
// Cards are the provider's documented test cards (see check-values.md): 4242 approves, 0002 declines.
import AxeBuilder from '@axe-core/playwright';
import { errorsOf, expect, pageAs, test } from './fixtures';
import { shot } from './shots';

test('part cash, part card, a declined card replaced, one part refunded', async ({ browser }) => {
  // four signed-in pages and an axe audit: past Playwright's 30 s once on a loaded full run (a
  // safety net, not a measure)
  test.setTimeout(90_000);
  const counter = await pageAs(browser, 'cashier', '/counter', { width: 1024, height: 768 });
  const bar = await pageAs(browser, 'barista', '/bar');
  await expect(counter.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  await expect(bar.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();

  // A small whole-milk latte: $4.80 + 8.25 % tax = $5.20 (as in counter-payments.spec.ts)
  await counter.getByRole('button', { name: /^Latte/ }).click();
  await counter.getByRole('radio', { name: /Small/ }).click();
  await counter.getByRole('button', { name: /Add to order/ }).click();
  await counter.getByLabel('Name for the cup').fill('Rosalind Vey');
  await expect(counter.getByTestId('order-total')).toHaveText('$5.20');
  await counter.getByRole('radiogroup', { name: 'Payment' }).getByRole('radio', { name: 'Split' }).click();

  const parts = counter.getByTestId('split-part');
  await expect(parts).toHaveCount(2);
  // part 1: $2.00 in cash from a $5 note, $3.00 change; part 2 is the rest, $3.20, on a card
  await parts.nth(0).getByLabel('Part 1 amount').fill('2.00');
  await expect(counter.getByTestId('split-rest')).toHaveText('the rest $3.20');
  await parts.nth(0).getByLabel('Cash handed over').fill('5');
  await expect(parts.nth(0)).toContainText('change $3.00');
  const send = counter.getByRole('button', { name: /^Take the parts · \$5\.20/ });
  await expect(counter.getByTestId('split-problem')).toHaveText('Part 2: choose the card');
  await expect(send).toBeDisabled();
  await parts.nth(1).getByLabel('Card presented').selectOption({ label: 'Card •••• 0002 (declines)' });
  await counter.screenshot(shot('counter-split'));
  await send.click();

  // declined: part 1 is paid and stays as it was; nothing reaches the bar
  await expect(counter.getByRole('alert')).toContainText('Part 2 of 2: Card declined');
  await expect(parts.nth(0)).toContainText('✓ Paid');
  await expect(parts.nth(0).getByLabel('Part 1 amount')).toBeDisabled();
  await counter.screenshot(shot('counter-split-declined'));
  // the parts and the send bar pass WCAG 2.1 A/AA (axe-core), paid part and alert included
  const { violations } = await new AxeBuilder({ page: counter })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'])
    .include('[data-testid="split-editor"]')
    .include('[aria-label="Order and payment"]')
    .analyze();
  expect(violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.id}: ${v.help}`)).toEqual([]);
  await expect(bar.getByTestId('drink-card').filter({ hasText: 'Rosalind Vey' })).toHaveCount(0);

  // another card for part 2: the order is paid in two parts and the latte goes to the bar
  await parts.nth(1).getByLabel('Card presented').selectOption({ label: 'Visa •••• 4242 (approves)' });
  await send.click();
  const sent = counter.getByRole('status').filter({ hasText: /Sent #\d+ for Rosalind Vey/ });
  await expect(sent).toContainText('paid in 2 parts');
  await expect(sent.getByTestId('sent-change')).toHaveText('$3.00');
  await expect(bar.getByTestId('drink-card').filter({ hasText: 'Rosalind Vey' })).toHaveCount(1);

  // the receipt lists each part
  const receiptHref = await sent.getByRole('link', { name: 'Receipt' }).getAttribute('href');
  const receipt = await pageAs(browser, 'cashier', receiptHref!);
  await expect(receipt.getByText('Part 1 · cash')).toBeVisible();
  await expect(receipt.getByText('Part 2 · card')).toBeVisible();
  await receipt.screenshot(shot('receipt-split'));

  // a lead gives back the cash part alone
  const lead = await pageAs(browser, 'lead', '/counter', { width: 1280, height: 900 });
  await lead.getByRole('button', { name: 'Today’s orders' }).click();
  await lead.getByLabel('Find an order by name or number').fill('Rosalind');
  const row = lead.getByTestId('order-row').filter({ hasText: 'Rosalind Vey' });
  await expect(row).toContainText('Split: cash $2.00 + card $3.20');
  await row.getByRole('button', { name: 'Refund part 1…' }).click();
  await row.getByLabel('Reason').fill('Paid twice by mistake');
  await row.getByRole('button', { name: 'Refund part 1 · cash $2.00' }).click();
  await expect(row).toContainText('refunded $2.00');
  await expect(row.getByRole('button', { name: 'Refund part 1…' })).toHaveCount(0);
  await expect(row.getByRole('button', { name: 'Refund part 2…' })).toBeVisible();
  await lead.screenshot(shot('orders-split-refund'));

  for (const page of [counter, bar, lead, receipt]) expect(errorsOf(page).filter((e) => !/402/.test(e))).toEqual([]);
});

test('on a phone the parts sit under the payment choice, and nothing scrolls sideways', async ({ browser }) => {
  const phone = await pageAs(browser, 'cashier', '/counter', { width: 390, height: 844 });
  await phone.getByRole('button', { name: /^Espresso/ }).click();
  await phone.getByRole('button', { name: /Add to order/ }).click();
  await phone.getByRole('button', { name: /^Order · / }).click();
  await phone.getByRole('radiogroup', { name: 'Payment' }).getByRole('radio', { name: 'Split' }).click();
  const parts = phone.getByTestId('split-part');
  await expect(parts).toHaveCount(2);
  await phone.getByRole('button', { name: '+ Another part' }).click();
  await expect(parts).toHaveCount(3);
  await parts.nth(2).scrollIntoViewIfNeeded();
  await expect(parts.nth(2).getByLabel('Card presented')).toBeInViewport();
  expect(await phone.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  // every control inside its part and on the screen (a fieldset grows to its content unless told not to)
  const aside = phone.getByRole('complementary');
  expect(
    await aside.evaluate(
      (el) => [el, ...el.querySelectorAll('*')].filter((e) => e.scrollWidth > e.clientWidth + 1 && getComputedStyle(e).overflowX !== 'visible').length,
    ),
  ).toBe(0);
  for (const button of await phone.getByRole('button', { name: /^Remove part/ }).all()) {
    const box = (await button.boundingBox())!;
    expect(box.x + box.width).toBeLessThanOrEqual(390);
  }
  await phone.screenshot(shot('counter-split-phone'));
  expect(errorsOf(phone)).toEqual([]);
});
