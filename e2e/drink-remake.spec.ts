// One drink of a paid order, end to end: a lead at the Counter sends a spilled flat white back to
// the Bar as a remake (the Bar card says "Remake" and why), refunds one espresso that was not made
// yet (it leaves the Bar live), the Bar bumps the remake, and the Reports screen counts it as waste.
import type { APIRequestContext } from '@playwright/test';
import { apiAs, errorsOf, expect, pageAs, test } from './fixtures';
import { ownServerFor } from './own-server';
import { shot } from './shots';

// a board with only this spec's orders on it: the Bar's cards below are exactly these
const own = ownServerFor('drink-remake');

async function placeOrder(lead: APIRequestContext, customerName: string, names: string[]) {
  const menu = await (await lead.get('/api/menu')).json();
  const items = names.map((n) => ({ menuItemId: menu.items.find((i: { name: string }) => i.name === n).id }));
  const res = await lead.post('/api/orders', {
    data: { clientOrderId: crypto.randomUUID(), customerName, items, payment: { method: 'cash', tenderedCents: 2000 } },
  });
  expect(res.status()).toBe(201);
  return (await res.json()).order as { id: number; number: number; lines: { id: number; itemName: string }[] };
}

test('remake a spilled drink and refund one not made yet, from Today’s orders; the Bar and Reports follow', async ({ browser }) => {
  // three signed-in pages on a server of its own: a net, not a measure
  test.setTimeout(120_000);
  const lead = await apiAs(own.baseURL, 'lead');
  const barista = await apiAs(own.baseURL, 'barista');
  const wren = await placeOrder(lead, 'Wren Alder', ['Flat white', 'Espresso']);
  for (const line of wren.lines) expect((await barista.post(`/api/drinks/${line.id}/bump`)).status()).toBe(200);
  await placeOrder(lead, 'Cosmo Reed', ['Flat white', 'Espresso']);

  const bar = await pageAs(browser, 'barista', '/bar', { width: 1920, height: 1080 }, own.baseURL);
  const counter = await pageAs(browser, 'lead', '/counter', { width: 1280, height: 900 }, own.baseURL);
  await expect(bar.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  await expect(counter.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  const cards = (name: string) => bar.getByTestId('drink-card').filter({ hasText: name });
  await expect(cards('Wren Alder')).toHaveCount(0);
  await expect(cards('Cosmo Reed')).toHaveCount(2);

  await counter.getByRole('button', { name: 'Today’s orders' }).click();
  const drawer = counter.getByRole('dialog', { name: 'Today’s orders' });
  const wrenRow = drawer.getByTestId('order-row').filter({ hasText: 'Wren Alder' });
  const wrenFlatWhite = wrenRow.getByTestId('order-drink').filter({ hasText: 'Flat white' });
  await expect(wrenFlatWhite).toContainText('made');
  await wrenFlatWhite.getByRole('button', { name: 'Remake…' }).click();
  await wrenFlatWhite.getByRole('radio', { name: 'Spilled or dropped' }).check();
  await wrenFlatWhite.getByLabel('Note for the bar').fill('Dropped at the pass');
  await drawer.screenshot(shot('drink-remake-form'));
  await wrenFlatWhite.getByRole('button', { name: 'Send remake to the bar' }).click();

  // the remake: a new drink on the same ticket, marked in words, and back on the Bar live
  const remakeRow = wrenRow.getByTestId('order-drink').filter({ has: counter.getByTestId('remake-mark') });
  await expect(remakeRow).toContainText('Remake');
  await expect(remakeRow).toContainText('Spilled: Dropped at the pass');
  await expect(wrenFlatWhite.first()).toContainText('made · remade');
  const remadeCard = cards('Wren Alder');
  await expect(remadeCard).toHaveCount(1);
  await expect(remadeCard.getByTestId('remake')).toHaveText('Remake · Spilled: Dropped at the pass');

  // Cosmo's espresso was not made yet: refunding it gives back its share (3.20 + 8.25 % tax of
  // the order's, worked out by hand: 844 − round(844 × 460 / 780) = 346) and takes it off the Bar
  const cosmoEspresso = drawer.getByTestId('order-row').filter({ hasText: 'Cosmo Reed' }).getByTestId('order-drink').filter({ hasText: 'Espresso' });
  await cosmoEspresso.getByRole('button', { name: 'Refund drink…' }).click();
  await cosmoEspresso.getByLabel('Why refund the Espresso', { exact: false }).fill('Customer could not wait');
  await cosmoEspresso.getByRole('button', { name: 'Refund $3.46' }).click();
  await expect(cosmoEspresso).toContainText('refunded');
  await expect(cards('Cosmo Reed')).toHaveCount(1);
  await expect(cards('Cosmo Reed')).toContainText('Flat white');
  await drawer.screenshot(shot('drink-remake-drawer'));
  await bar.screenshot(shot('drink-remake-bar'));

  // the Pickup wall says, in a word, that Wren's order is being made again
  const pickup = await pageAs(browser, 'lead', '/pickup', { width: 1920, height: 1080 }, own.baseURL);
  const wrenName = pickup.getByTestId('pickup-name').filter({ hasText: 'Wren' });
  await expect(wrenName.getByTestId('pickup-remake')).toHaveText('remake');
  await pickup.screenshot(shot('drink-remake-pickup'));

  // the Bar bumps the remake: Wren's order is ready again

  await remadeCard.getByRole('button', { name: 'Bump ✓' }).click();
  await expect(cards('Wren Alder')).toHaveCount(0);
  await expect(wrenName.getByTestId('pickup-remake')).toHaveCount(0);

  const reports = await pageAs(browser, 'lead', '/reports', { width: 1600, height: 1000 }, own.baseURL);
  const panel = reports.getByRole('region', { name: 'Remakes', exact: true });
  await expect(panel.getByTestId('remake-waste')).toContainText('Spilled');
  await panel.scrollIntoViewIfNeeded();
  await panel.screenshot(shot('drink-remake-report'));

  for (const page of [bar, counter, pickup, reports]) expect(errorsOf(page)).toEqual([]);
});
