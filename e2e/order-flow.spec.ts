// The foundation path end to end: Counter → Bar → Pickup, live, in Debian's Chromium.
import { errorsOf, expect, pageAs, test } from './fixtures';
import { ownServerFor } from './own-server';
import { shot } from './shots';

// a board with only this order on it, so Pickup shows its name whatever other specs left open
const own = ownServerFor('order-flow');

test('an order of three drinks travels live from the Counter to the Bar to Pickup', async ({ browser }) => {
  const bar = await pageAs(browser, 'barista', '/bar', undefined, own.baseURL);
  const pickup = await pageAs(browser, 'lead', '/pickup', undefined, own.baseURL);
  const counter = await pageAs(browser, 'cashier', '/counter', { width: 1280, height: 800 }, own.baseURL);
  await expect(bar.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  await expect(pickup.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  await expect(counter.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  // a marker that a reload would wipe: the bar must update in place
  await bar.evaluate(() => ((window as unknown as { marker: number }).marker = 42));

  // Counter: oat latte (tile → milk → add), whole cappuccino, whole flat white
  await counter.getByRole('button', { name: /^Latte/ }).click();
  await counter.getByRole('radio', { name: /Oat/ }).click();
  await counter.getByRole('dialog').screenshot(shot('counter-item-sheet'));
  await counter.getByRole('button', { name: /Add to order/ }).click();
  await counter.getByRole('button', { name: /^Cappuccino/ }).click();
  await counter.getByRole('button', { name: /Add to order/ }).click();
  await counter.getByRole('button', { name: /^Flat white/ }).click();
  await counter.getByRole('button', { name: /Add to order/ }).click();
  await expect(counter.getByTestId('order-line')).toHaveCount(3);
  await counter.getByLabel('Name for the cup').fill('Robin Vale');
  await counter.getByRole('button', { name: '$20.00' }).click();
  await counter.screenshot(shot('counter'));
  const sentAt = Date.now();
  await counter.getByRole('button', { name: /^Send/ }).click();
  const sent = counter.getByRole('status').filter({ hasText: /Sent #\d+/ });
  await expect(sent).toContainText('Robin Vale');
  const number = /Sent #(\d+)/.exec((await sent.textContent()) ?? '')![1];

  // Bar: the drinks arrive in their milk lanes without a reload
  const oat = bar.getByTestId('lane').filter({ has: bar.getByRole('heading', { name: 'Oat' }) });
  const whole = bar.getByTestId('lane').filter({ has: bar.getByRole('heading', { name: 'Whole' }) });
  await expect(oat.getByTestId('drink-card').filter({ hasText: 'Robin Vale' })).toHaveCount(1);
  test.info().annotations.push({ type: 'order → bar screen (ms, informational)', description: String(Date.now() - sentAt) });
  await expect(whole.getByTestId('drink-card').filter({ hasText: 'Robin Vale' })).toHaveCount(2);
  await expect(oat.getByTestId('drink-card').filter({ hasText: 'Robin Vale' })).toContainText('Latte');
  const robinsWhole = whole.getByTestId('drink-card').filter({ hasText: 'Robin Vale' });
  await expect(robinsWhole.filter({ hasText: 'Cappuccino' })).toHaveCount(1);
  await expect(robinsWhole.filter({ hasText: 'Flat white' })).toHaveCount(1);
  expect(await bar.evaluate(() => (window as unknown as { marker?: number }).marker)).toBe(42);
  await expect(pickup.getByRole('region', { name: 'Being made' })).toContainText('Robin');
  await bar.screenshot(shot('bar'));

  // Bar: bump all three
  const robins = bar.getByTestId('drink-card').filter({ hasText: 'Robin Vale' });
  for (let left = 3; left > 0; left--) {
    await robins.first().getByRole('button', { name: 'Bump ✓' }).click();
    await expect(robins).toHaveCount(left - 1);
  }

  // Pickup: the first name under "Ready", and only the first name
  const ready = pickup.getByRole('region', { name: 'Ready' });
  await expect(ready.getByTestId('pickup-name').filter({ hasText: 'Robin' })).toHaveCount(1);
  await expect(ready).not.toContainText('Vale');
  await expect(pickup.getByRole('region', { name: 'Being made' })).not.toContainText('Robin');
  await pickup.screenshot(shot('pickup'));

  // Recall from the bar brings the ticket back
  await bar.getByRole('button', { name: `Recall #${number} Robin Vale` }).click();
  await expect(robins).toHaveCount(1);
  await expect(pickup.getByRole('region', { name: 'Being made' })).toContainText('Robin');

  for (const page of [bar, pickup, counter]) expect(errorsOf(page)).toEqual([]);
});
