// Hostile text arriving by live update renders as text: the Bar and Pickup are already open when
// an order with markup in its name, drink note and allergy note comes over the socket. Nothing
// runs (window.pwned stays unset) and nothing is even tried (the CSP would log a refused inline
// handler as a console error).
import { DEMO_PASSWORD, errorsOf, expect, pageAs, test } from './fixtures';
import { ownServerFor } from './own-server';
import { shot } from './shots';

const NAME = '<img/src="x"/onerror="window.pwned=1">';
const NOTE = '"><svg onload="window.pwned=2"> oat foam';
const ALLERGY = '<script>window.pwned=3</script> nuts';

// a board with only this order on it: on the shared server the tickets earlier specs left open can
// fill the Pickup wall, and a name counted in "+n more" is not shown at all
const own = ownServerFor('injection');

test('an order full of markup, pushed to open Bar and Pickup screens, shows as text and runs nothing', async ({ browser, playwright }) => {
  const baseURL = own.baseURL;
  const bar = await pageAs(browser, 'barista', '/bar', undefined, baseURL);
  const pickup = await pageAs(browser, 'cashier', '/pickup', undefined, baseURL);
  for (const p of [bar, pickup]) await expect(p.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();

  const api = await playwright.request.newContext({ baseURL });
  await api.post('/api/session', { data: { username: 'cashier', password: DEMO_PASSWORD } });
  const menu = await (await api.get('/api/menu')).json();
  const latte = menu.items.find((i: { name: string }) => i.name === 'Latte').id;
  const res = await api.post('/api/orders', {
    data: {
      clientOrderId: crypto.randomUUID(),
      customerName: NAME,
      allergyNote: ALLERGY,
      items: [{ menuItemId: latte, note: NOTE }],
      payment: { method: 'cash', tenderedCents: 1000 },
    },
  });
  expect(res.status()).toBe(201);
  await api.dispose();

  const card = bar.getByTestId('drink-card').filter({ hasText: NAME });
  await expect(card).toBeVisible();
  await expect(card).toContainText(NOTE);
  await expect(card).toContainText(ALLERGY);
  await expect(pickup.getByTestId('pickup-name').filter({ hasText: NAME })).toBeVisible();
  await bar.screenshot(shot('injection-bar-hostile'));
  await pickup.screenshot(shot('injection-pickup-hostile'));

  for (const p of [bar, pickup]) {
    expect(await p.evaluate(() => (window as unknown as { pwned?: number }).pwned)).toBeUndefined();
    expect(await p.locator('svg[onload], img[onerror], #root script').count()).toBe(0);
    expect(errorsOf(p)).toEqual([]);
  }
});
