// The Outbox: a receipt mailed from the Counter's API arrives over the local SMTP fake and the
// lead reads it on the screen, signed in through the real form.
import { DEMO_PASSWORD, errorsOf, expect, pageAs, test } from './fixtures';
import { shot } from './shots';

test('a lead sees a mailed receipt in the Outbox, with the demo note', async ({ browser, playwright, baseURL }) => {
  const api = await playwright.request.newContext({ baseURL });
  await api.post('/api/session', { data: { username: 'cashier', password: DEMO_PASSWORD } });
  const menu = await (await api.get('/api/menu')).json();
  const id = (name: string) => menu.items.find((i: { name: string }) => i.name === name).id;
  const placed = await api.post('/api/orders', {
    data: {
      clientOrderId: crypto.randomUUID(),
      customerName: 'Juniper Vale',
      items: [{ menuItemId: id('Flat white') }, { menuItemId: id('Banana bread') }],
      payment: { method: 'cash', tenderedCents: 2000 },
    },
  });
  expect(placed.status()).toBe(201);
  const { order } = await placed.json();
  const sent = await api.post(`/api/orders/${order.id}/receipt`, { data: { email: 'juniper@example.com' } });
  expect(sent.status()).toBe(202);
  await api.dispose();

  const page = await pageAs(browser, 'lead', '/outbox', { width: 1440, height: 900 });
  await expect(page.getByRole('heading', { name: 'Outbox', level: 1 })).toBeVisible();
  await expect(page.getByText('Mail sent by Jugline in this demo is caught here; nothing leaves this machine.')).toBeVisible();
  const subject = `order #${order.number}`;
  await expect(page.getByTestId('outbox-mail').filter({ hasText: subject })).toBeVisible();
  await page.getByTestId('outbox-mail').filter({ hasText: subject }).click();
  await expect(page.getByRole('heading', { level: 2 })).toContainText(subject);
  await expect(page.getByTestId('outbox-text')).toContainText('Thank you, Juniper!');
  await expect(page.getByTestId('outbox-text')).toContainText('Total: $');
  await page.screenshot(shot('outbox'));
  expect(errorsOf(page)).toEqual([]);
});

test('a barista who opens the Outbox gets the 403 screen', async ({ browser }) => {
  const page = await pageAs(browser, 'barista', '/bar');
  const res = await page.goto('/outbox');
  expect(res?.status()).toBe(403);
  await expect(page.getByRole('heading', { name: 'Not your screen' })).toBeVisible();
});
