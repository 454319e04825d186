// The ready mail end to end: the cashier takes an order with the customer's address (the Counter
// says what it is used for), the barista bumps its drinks on the Bar, and the owner finds the
// "ready" mail the local SMTP fake caught in the Outbox.
import { errorsOf, expect, pageAs, test } from './fixtures';
import { shot } from './shots';

test('a customer who left an address is mailed when the Bar bumps the last drink', async ({ browser }) => {
  // three signed-in pages and a full order: past Playwright's 30 s once on a loaded run; a net, not a measure
  test.setTimeout(90_000);
  const bar = await pageAs(browser, 'barista', '/bar');
  const counter = await pageAs(browser, 'cashier', '/counter', { width: 1280, height: 800 });
  await expect(bar.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  await expect(counter.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();

  await counter.getByRole('button', { name: /^Cappuccino/ }).click();
  await counter.getByRole('button', { name: /Add to order/ }).click();
  await counter.getByRole('button', { name: /^Flat white/ }).click();
  await counter.getByRole('button', { name: /Add to order/ }).click();
  await expect(counter.getByTestId('order-line')).toHaveCount(2);
  await counter.getByLabel('Name for the cup').fill('Juniper Hale');
  const address = counter.getByLabel('E-mail receipt (optional)');
  // the customer is told what the address is for before giving it
  await expect(address).toHaveAccessibleDescription('Used for the receipt and one note when the order is ready; nothing else.');
  await address.fill('juniper.hale@example.test');
  await counter.getByText('Used for the receipt and one note').scrollIntoViewIfNeeded();
  await counter.screenshot(shot('ready-mail-counter'));
  await counter.getByRole('button', { name: '$20.00' }).click();
  await counter.getByRole('button', { name: /^Send/ }).click();
  const sent = counter.getByRole('status').filter({ hasText: /Sent #\d+ for Juniper Hale/ });
  await expect(sent).toBeVisible();
  const number = /Sent #(\d+)/.exec((await sent.textContent()) ?? '')![1];

  const juniper = bar.getByTestId('drink-card').filter({ hasText: 'Juniper Hale' });
  await expect(juniper).toHaveCount(2);
  for (let left = 2; left > 0; left--) {
    await juniper.first().getByRole('button', { name: 'Bump ✓' }).click();
    await expect(juniper).toHaveCount(left - 1);
  }

  // the Outbox lists what the fake has caught when it loads: look again until the mail is there
  const owner = await pageAs(browser, 'owner', '/outbox', { width: 1366, height: 900 });
  const subject = `Your order #${number} is ready at Harbour & Hearth Coffee`;
  const mail = owner.getByTestId('outbox-mail').filter({ hasText: subject });
  await expect(async () => {
    await owner.reload();
    await expect(mail).toHaveCount(1, { timeout: 1000 });
  }).toPass();
  await mail.click();
  await expect(owner.getByRole('heading', { name: subject })).toBeVisible();
  const text = owner.getByTestId('outbox-text');
  await expect(text).toContainText(`Order #${number} is ready, Juniper!`);
  await expect(text).toContainText('1 × Cappuccino');
  await expect(text).toContainText('1 × Flat white');
  await expect(text).toContainText(`Ask for #${number}, Juniper Hale`);
  await expect(owner.getByRole('article')).toContainText('juniper.hale@example.test');
  await owner.screenshot(shot('ready-mail'));

  for (const page of [bar, counter, owner]) expect(errorsOf(page)).toEqual([]);
});

test('the owner turns the ready mail off in Settings, and an open Counter says the address is for the receipt only', async ({ browser }) => {
  const counter = await pageAs(browser, 'cashier', '/counter', { width: 1280, height: 800 });
  const owner = await pageAs(browser, 'owner', '/admin/settings', { width: 1440, height: 1000 });
  await expect(counter.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  await expect(owner.getByRole('button', { name: 'Save' }).first()).toBeEnabled(); // hydrated
  const address = counter.getByLabel('E-mail receipt (optional)');
  await expect(address).toHaveAccessibleDescription(/one note when the order is ready/);

  const section = owner.getByRole('form', { name: 'Receipts and Pickup', exact: true });
  const readyMail = section.getByRole('checkbox', { name: 'Mail the customer when the order is ready' });
  await expect(readyMail).toBeChecked(); // on by default
  await readyMail.uncheck();
  await section.getByRole('button', { name: 'Save' }).click();
  await expect(section.getByRole('status')).toContainText('Saved');
  await section.screenshot(shot('ready-mail-setting'));
  // the settings change reaches the open Counter live (menu.changed), without a reload
  await expect(address).toHaveAccessibleDescription('Used for the receipt only; nothing else.');

  // back on, as the other specs expect the demo café
  await readyMail.check();
  await section.getByRole('button', { name: 'Save' }).click();
  await expect(section.getByRole('status')).toContainText('Saved');
  await expect(address).toHaveAccessibleDescription(/one note when the order is ready/);

  for (const page of [counter, owner]) expect(errorsOf(page)).toEqual([]);
});
