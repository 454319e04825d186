// The server goes away as the cashier presses Send: the Counter keeps the order in the browser,
// says it is not sent yet, and sends it by itself, once, when the server is back — and the
// receipt address travels with it, so the customer is mailed the receipt then.
// This test runs its own server (not Playwright's webServer) so it can kill it and start it again
// on the same database file, the way a crashed or restarted café server comes back.
import { request as apiRequest, type BrowserContext } from '@playwright/test';
import { DEMO_PASSWORD, expect, signIn, test } from './fixtures';
import { expectedWhileDown, OwnServer } from './own-server';
import { shot } from './shots';

let own: OwnServer;

test.describe('Counter with the server gone', () => {
  let context: BrowserContext;

  test.beforeAll(async ({ browser }) => {
    own = await OwnServer.create('offline'); // its database file is kept across the restart, sessions too
    await own.start();
    context = await browser.newContext({ baseURL: own.baseURL, viewport: { width: 1280, height: 800 } });
  });

  /** A page whose errors are collected, apart from the ones a server that is down makes. */
  async function watchedPage() {
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    page.on('console', (m) => {
      if (m.type() === 'error' && !expectedWhileDown.some((re) => re.test(m.text()))) errors.push(m.text());
    });
    return { page, errors };
  }

  test.afterAll(async () => {
    await context?.close();
    await own?.dispose();
  });

  test('an order sent while the server is down waits in the browser and goes once when it is back', async () => {
    test.setTimeout(120_000);
    const { page, errors } = await watchedPage();

    await signIn(page, 'cashier', '/counter');
    await page.waitForURL('**/counter');
    await expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
    // a marker that a reload would wipe: the order must go without one
    await page.evaluate(() => ((window as unknown as { marker: number }).marker = 42));

    await page.getByRole('button', { name: /^Espresso/ }).click();
    await page.getByRole('button', { name: /Add to order/ }).click();
    await expect(page.getByTestId('order-line')).toHaveCount(1);
    await page.getByLabel('Name for the cup').fill('Wren Ashby');
    await page.getByLabel('E-mail receipt (optional)').fill('wren.ashby@example.test');

    await own.kill();
    await page.getByRole('button', { name: /^Send/ }).click();

    const banner = page.getByTestId('offline-orders');
    await expect(banner).toContainText('1 order not sent yet — will send when the server is back');
    await expect(banner.getByTestId('offline-order')).toHaveText([/Wren Ashby.*\$\d+\.\d\d.*Not sent yet/]);
    await expect(banner.getByRole('button', { name: 'Send now' })).toBeVisible();
    // taken like a sent order: the form is clear for the next customer, and no error or "Sent"
    await expect(page.getByTestId('order-line')).toHaveCount(0);
    await expect(page.getByLabel('Name for the cup')).toHaveValue('');
    await expect(page.getByRole('alert')).toHaveCount(0);
    await expect(page.getByRole('status').filter({ hasText: /Sent #/ })).toHaveCount(0);
    // it is in IndexedDB, not only in the page (the offline orders' store keeps its first name)
    const stored = await page.evaluate(
      () =>
        new Promise<string[]>((resolve, reject) => {
          const open = indexedDB.open('jugline');
          open.onerror = () => reject(open.error);
          open.onsuccess = () => {
            const all = open.result.transaction('pending-orders').objectStore('pending-orders').getAll();
            all.onsuccess = () => resolve(all.result.map((o: { body: { customerName: string } }) => o.body.customerName));
            all.onerror = () => reject(all.error);
          };
        }),
    );
    expect(stored).toEqual(['Wren Ashby']);

    await own.start();
    // sent by itself (backoff timer, 'online' or the socket's reconnect), without a reload
    await expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible({ timeout: 30_000 });
    await expect(banner).toHaveCount(0, { timeout: 45_000 });
    expect(await page.evaluate(() => (window as unknown as { marker?: number }).marker)).toBe(42);

    const api = await apiRequest.newContext({ baseURL: own.baseURL });
    const signedIn = await api.post('/api/session', { data: { username: 'cashier', password: DEMO_PASSWORD } });
    expect(signedIn.ok()).toBe(true);
    const res = await api.get('/api/tickets?view=open');
    expect(res.ok()).toBe(true);
    const { tickets } = (await res.json()) as { tickets: { customerName: string }[] };
    expect(tickets.filter((t) => t.customerName === 'Wren Ashby')).toHaveLength(1);
    await api.dispose();

    // the receipt reached the mail server (the local fake's Outbox), once; only a lead reads it
    const lead = await apiRequest.newContext({ baseURL: own.baseURL });
    expect((await lead.post('/api/session', { data: { username: 'lead', password: DEMO_PASSWORD } })).ok()).toBe(true);
    const receiptsToWren = async () => {
      const outbox = (await (await lead.get('/api/outbox')).json()) as { mails: { to: string[]; subject: string }[] };
      return outbox.mails.filter((m) => m.to.includes('wren.ashby@example.test'));
    };
    await expect.poll(async () => (await receiptsToWren()).length, { timeout: 15_000 }).toBe(1);
    expect((await receiptsToWren())[0].subject).toMatch(/^Your receipt from .+ — order #\d+$/);
    await lead.dispose();

    expect(errors).toEqual([]);
  });

  test('a card order taken while the server is down is held, never charged by itself, and the cashier settles it', async () => {
    test.setTimeout(120_000);
    const { page, errors } = await watchedPage();
    await signIn(page, 'cashier', '/counter');
    await page.waitForURL('**/counter');
    await expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();

    await page
      .getByRole('tabpanel')
      .getByRole('button', { name: /^Long black/ })
      .click();
    await page.getByRole('button', { name: /Add to order/ }).click();
    await page.getByLabel('Name for the cup').fill('Cass Moor');
    await page.getByRole('radio', { name: 'Card' }).click();
    await page.getByRole('radio', { name: /4242/ }).click();

    await own.kill();
    await page.getByRole('button', { name: /^Charge card/ }).click();
    const banner = page.getByTestId('offline-orders');
    await expect(banner).toContainText('1 card order held — not charged; ask the customer');
    await expect(banner.getByTestId('offline-order')).toContainText('Card not charged');
    await expect(banner.getByRole('button', { name: 'Send now' })).toHaveCount(0);

    await own.start();
    await expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible({ timeout: 30_000 });
    // back online, and still only asked: nothing was sent, nothing charged
    await page.evaluate(() => window.dispatchEvent(new Event('online')));
    await expect(banner.getByRole('button', { name: 'Cass Moor paid cash' })).toBeVisible();
    const api = await apiRequest.newContext({ baseURL: own.baseURL });
    expect((await api.post('/api/session', { data: { username: 'cashier', password: DEMO_PASSWORD } })).ok()).toBe(true);
    const ordersFor = async () =>
      (
        (await (await api.get('/api/orders?q=Cass')).json()) as { orders: { customerName: string; payment: { method: string }; paymentStatus: string }[] }
      ).orders.filter((o) => o.customerName === 'Cass Moor');
    expect(await ordersFor()).toEqual([]);
    await page.screenshot(shot('counter-card-held'));

    // the customer paid cash meanwhile: the order goes once, as cash
    await banner.getByRole('button', { name: 'Cass Moor paid cash' }).click();
    await expect(banner).toHaveCount(0);
    await expect(page.getByRole('status').filter({ hasText: /Sent #\d+ for Cass Moor/ })).toBeVisible();
    const orders = await ordersFor();
    expect(orders.map((o) => [o.payment.method, o.paymentStatus])).toEqual([['cash', 'paid']]);
    await api.dispose();
    expect(errors).toEqual([]);
  });
});
