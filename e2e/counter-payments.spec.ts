// The Counter's payments end to end: a card that pays (drink to the bar, croissant kept at the
// counter, receipt mailed to the Outbox), a card that is declined (nothing on the bar), and cash
// with change. Card numbers are the provider's documented test cards (see check-values.md).
import { errorsOf, expect, pageAs, test } from './fixtures';
import { shot } from './shots';

test('card, decline and cash at the Counter', async ({ browser }) => {
  const counter = await pageAs(browser, 'cashier', '/counter', { width: 1280, height: 900 });
  const bar = await pageAs(browser, 'barista', '/bar');
  await expect(counter.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  await expect(bar.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();

  // An oat latte with an extra shot and a croissant, paid by a card that approves
  await counter.getByRole('button', { name: /^Latte/ }).click();
  await counter.getByRole('radio', { name: /Oat/ }).click();
  await counter.getByRole('button', { name: 'One shot more' }).click();
  await counter.getByRole('button', { name: /Add to order/ }).click();
  await counter.getByRole('tab', { name: 'Food' }).click();
  await counter.getByRole('button', { name: /^Butter croissant/ }).click();
  await expect(counter.getByTestId('order-line')).toHaveCount(2);
  await counter.getByLabel('Name for the cup').fill('Nadia Ferris');
  await counter.getByLabel('E-mail receipt (optional)').fill('nadia@example.test');
  await counter.getByRole('radio', { name: 'Card' }).click();
  await counter.getByRole('radio', { name: /4242/ }).click();
  await counter.screenshot(shot('counter-card'));
  await counter.getByRole('button', { name: /^Charge card/ }).click();
  const sent = counter.getByRole('status').filter({ hasText: /Sent #\d+ for Nadia Ferris/ });
  await expect(sent).toContainText('card paid');
  await expect(sent.getByTestId('quote')).toContainText(/About \d+ min/);
  const number = /Sent #(\d+)/.exec((await sent.textContent()) ?? '')![1];

  const nadia = bar.getByTestId('drink-card').filter({ hasText: 'Nadia Ferris' });
  await expect(nadia).toHaveCount(1); // the latte; the croissant stays at the counter
  await expect(nadia).toContainText('Latte');
  await expect(nadia).toContainText('3 shots');
  await expect(bar.getByTestId('lane').filter({ has: bar.getByRole('heading', { name: 'Oat' }) })).toContainText('Nadia Ferris');
  await expect(bar.getByText('Butter croissant')).toHaveCount(0);

  const lead = await pageAs(browser, 'lead', '/outbox', { width: 1280, height: 900 });
  await expect(lead.getByText('nadia@example.test').first()).toBeVisible();
  await expect(lead.getByText(new RegExp(`#${number}`)).first()).toBeVisible();

  // A card that is declined: a clear message, and nothing on the bar
  await counter.getByRole('button', { name: 'OK', exact: true }).click();
  await counter.getByRole('tab', { name: 'Espresso' }).click();
  await counter.getByRole('button', { name: /^Espresso/ }).click();
  await counter.getByRole('button', { name: /Add to order/ }).click();
  await counter.getByLabel('Name for the cup').fill('Omar Quint');
  await counter.getByRole('radio', { name: 'Card' }).click();
  await counter.getByRole('radio', { name: /0002/ }).click();
  await counter.getByRole('button', { name: /^Charge card/ }).click();
  await expect(counter.getByRole('alert')).toContainText('declined');
  await counter.screenshot(shot('counter-declined'));
  await expect(bar.getByTestId('drink-card').filter({ hasText: 'Omar Quint' })).toHaveCount(0);

  // The customer pays cash instead: the same order, now fired
  await counter.getByRole('radio', { name: 'Cash' }).click();
  await counter.getByRole('button', { name: /^Send/ }).click();
  await expect(counter.getByRole('status').filter({ hasText: 'Omar Quint' })).toBeVisible();
  await expect(bar.getByTestId('drink-card').filter({ hasText: 'Omar Quint' })).toHaveCount(1);

  // Cash with change: a small whole-milk latte, $4.80 + 8.25 % tax = $5.20 (0.396 rounds up,
  // Streamlined Sales and Use Tax Agreement §324); $20.00 tendered → $14.80 change
  await counter.getByRole('button', { name: 'OK', exact: true }).click();
  await counter.getByRole('button', { name: /^Latte/ }).click();
  await counter.getByRole('radio', { name: /Small/ }).click();
  await counter.getByRole('button', { name: /Add to order/ }).click();
  await counter.getByLabel('Name for the cup').fill('Pia Lund');
  await expect(counter.getByTestId('order-total')).toHaveText('$5.20');
  await counter.getByLabel(/Cash tendered/).fill('20.00');
  await expect(counter.getByTestId('change-due')).toHaveText('$14.80');
  await counter.getByRole('button', { name: /^Send/ }).click();
  await expect(counter.getByTestId('sent-change')).toHaveText('$14.80');

  for (const page of [counter, bar, lead]) expect(errorsOf(page).filter((e) => !/402/.test(e))).toEqual([]);
});

test('the receipt and cup labels print what was ordered, with the allergy', async ({ browser }) => {
  const counter = await pageAs(browser, 'cashier', '/counter', { width: 1280, height: 900 });
  await counter.getByRole('button', { name: /^Cappuccino/ }).click();
  await counter.getByRole('radio', { name: /Almond/ }).click();
  await counter.getByRole('button', { name: /Add to order/ }).click();
  await counter.getByRole('button', { name: /^Mocha/ }).click();
  await counter.getByRole('button', { name: /Add to order/ }).click();
  await counter.getByLabel('Name for the cup').fill('Quinn Arlo');
  await counter.getByRole('button', { name: /Allergy/ }).click();
  await counter.getByRole('button', { name: 'sesame' }).click();
  await counter.getByLabel("Allergy in the customer's words").fill('severe');
  await counter.getByRole('button', { name: /^Send/ }).click();
  const sent = counter.getByRole('status').filter({ hasText: 'Quinn Arlo' });
  await expect(sent).toBeVisible();

  const [labels] = await Promise.all([counter.waitForEvent('popup'), sent.getByRole('link', { name: 'Cup labels' }).click()]);
  await expect(labels.getByTestId('cup-label')).toHaveCount(2);
  await expect(labels.getByTestId('cup-label').first()).toContainText('ALLERGY: sesame · severe');
  await expect(labels.getByTestId('cup-label').first()).toContainText('Almond');
  await labels.screenshot(shot('cup-labels'));

  const [receipt] = await Promise.all([counter.waitForEvent('popup'), sent.getByRole('link', { name: 'Receipt' }).click()]);
  await expect(receipt.getByRole('heading', { name: 'Harbour & Hearth Coffee' })).toBeVisible();
  await expect(receipt.getByText('Cappuccino (Regular)')).toBeVisible();
  await receipt.screenshot(shot('receipt', { fullPage: true }));

  const missing = await receipt.goto('/receipts/999999');
  expect(missing?.status()).toBe(404);
  for (const page of [counter, labels]) expect(errorsOf(page)).toEqual([]);
});

test("an item the lead 86'd greys out on an open Counter at once, and comes back", async ({ browser, playwright, baseURL }) => {
  const counter = await pageAs(browser, 'cashier', '/counter', { width: 1280, height: 900 });
  await expect(counter.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  const mocha = counter.getByRole('button', { name: /^Mocha/ });
  await expect(mocha).toBeEnabled();

  const lead = await playwright.request.newContext({ baseURL });
  await lead.post('/api/session', { data: { username: 'lead', password: 'jugline-demo' } });
  const menu = await (await lead.get('/api/menu')).json();
  const id = menu.items.find((i: { name: string }) => i.name === 'Mocha').id;
  expect((await lead.post(`/api/menu/items/${id}/availability`, { data: { available: false } })).status()).toBe(200);
  await expect(mocha).toBeDisabled();
  await expect(mocha).toContainText("86'd");
  expect((await lead.post(`/api/menu/items/${id}/availability`, { data: { available: true } })).status()).toBe(200);
  await expect(mocha).toBeEnabled();
  await lead.dispose();
  expect(errorsOf(counter)).toEqual([]);
});

test('a drink that contains the customer’s allergen is caught at the Counter and flagged on the Bar', async ({ browser }) => {
  const counter = await pageAs(browser, 'cashier', '/counter', { width: 1024, height: 768 });
  const bar = await pageAs(browser, 'barista', '/bar');
  await counter.getByRole('button', { name: /^Flat white/ }).click();
  await expect(counter.getByTestId('sheet-contains')).toHaveText('Contains: milk'); // whole milk by default
  await counter.getByRole('radio', { name: /Almond/ }).click();
  await expect(counter.getByTestId('sheet-contains')).toHaveText('Contains: tree nuts');
  await counter.getByRole('button', { name: /Add to order/ }).click();
  await counter.getByLabel('Name for the cup').fill('Rhea Tamm');
  await counter.getByRole('button', { name: /Allergy/ }).click();
  await counter.getByRole('button', { name: 'tree nuts' }).click();
  const clash = counter.getByTestId('allergy-clash');
  await expect(clash).toContainText('Flat white contains tree nuts (from the almond milk)');
  await expect(counter.getByRole('button', { name: /^Send/ })).toBeDisabled();
  await counter.screenshot(shot('counter-allergy-clash'));
  await clash.getByRole('checkbox').check();
  await counter.getByRole('button', { name: /^Send/ }).click();
  await expect(counter.getByRole('status').filter({ hasText: 'Rhea Tamm' })).toContainText('allergy flagged');
  const card = bar.getByTestId('drink-card').filter({ hasText: 'Rhea Tamm' });
  await expect(card.getByTestId('contains-clash')).toContainText('THIS DRINK CONTAINS TREE NUTS');
  for (const page of [counter, bar]) expect(errorsOf(page)).toEqual([]);
});

test('signing out with an unsent order asks first; staying keeps the order', async ({ browser }) => {
  const counter = await pageAs(browser, 'cashier', '/counter', { width: 1280, height: 900 });
  await expect(counter.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  await counter.getByRole('button', { name: /^Latte/ }).click();
  await counter.getByRole('button', { name: /Add to order/ }).click();
  const asked: string[] = [];
  counter.once('dialog', (d) => {
    asked.push(d.message());
    void d.dismiss(); // "Cancel": stay
  });
  await counter.getByRole('button', { name: 'Sign out' }).click();
  await expect.poll(() => asked).toEqual(['The order being built (1 item) has not been sent and will be lost. Leave anyway?']);
  await expect(counter).toHaveURL(/\/counter$/);
  await expect(counter.getByRole('button', { name: /^Send/ })).toBeEnabled();
  expect(errorsOf(counter)).toEqual([]);
});
