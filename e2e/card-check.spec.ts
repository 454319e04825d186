// The card check: a lead reads the day's card money beside the card service's, finds the charge
// whose answer and webhook never came, settles it, and sees the day in step. The test runs its own
// server in this process (the production build on a fresh database), so it can reach the local
// payment fake's fault switches that lose the answer.
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { request as apiRequest, type APIRequestContext } from '@playwright/test';
import { loadConfig } from '@server/config';
import { startServer, type RunningServer } from '@server/server';
import { DEMO_PASSWORD, errorsOf, expect, signIn, test, watchForErrors } from './fixtures';
import { shot } from './shots';

const VISA = 'pm_card_visa'; // the provider's documented test cards (check-values.md, "Payments")
const DECLINED = 'pm_card_chargeDeclined';

let running: RunningServer;
let dir: string;

test.beforeAll(async () => {
  dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-e2e-cards-'));
  const config = loadConfig({
    NODE_ENV: 'production',
    PORT: '0',
    HOST: '127.0.0.1',
    DATABASE_FILE: path.join(dir, 'jugline.sqlite'),
    SEED_DEMO: 'true',
    LOG_LEVEL: 'silent',
  });
  running = await startServer(config, { pages: 'production', log: () => {} });
});
test.afterAll(async () => {
  await running?.close();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

async function apiAs(username: string): Promise<APIRequestContext> {
  const api = await apiRequest.newContext({ baseURL: running.url });
  expect((await api.post('/api/session', { data: { username, password: DEMO_PASSWORD } })).status()).toBe(200);
  return api;
}

test('a lead finds a charge Jugline never heard about, settles it, and the day is in step', async ({ browser }) => {
  test.slow(); // a lost answer is only lost after the SDK's own retries, which really wait
  const fake = running.payments.fake!;
  const cashier = await apiAs('cashier');
  const lead = await apiAs('lead');
  const menu = await (await cashier.get('/api/menu')).json();
  const item = (name: string) => menu.items.find((i: { name: string }) => i.name === name).id;
  const body = (customerName: string, paymentMethod: string) => ({
    clientOrderId: crypto.randomUUID(),
    customerName,
    items: [{ menuItemId: item('Flat white') }, { menuItemId: item('Banana bread') }],
    payment: { method: 'card', paymentMethod },
  });

  // A morning's cards: one paid, one declined and then paid, one refunded in part.
  const paid = await cashier.post('/api/orders', { data: body('Greer Calloway', VISA) });
  expect(paid.status()).toBe(201);
  const declined = body('Ottilie Brand', DECLINED);
  expect((await cashier.post('/api/orders', { data: declined })).status()).toBe(402);
  expect((await cashier.post('/api/orders', { data: { ...declined, payment: { method: 'card', paymentMethod: VISA } } })).status()).toBe(200);
  const paidId = (await paid.json()).order.id;
  expect((await lead.post(`/api/orders/${paidId}/refund`, { data: { reason: 'Spilled at the counter', amountCents: 250 } })).status()).toBe(200);

  // Two cards whose answers were lost and whose webhooks are held: one order the lead voids (its
  // charge is given back), one left for the card check to find.
  fake.faults.holdWebhooks(true);
  fake.faults.loseChargeAnswers();
  const voided = await cashier.post('/api/orders', { data: body('Lucan Merriweather', VISA) });
  const lost = await cashier.post('/api/orders', { data: body('Ysolde Fairbairn', VISA) });
  fake.faults.loseChargeAnswers(0);
  expect([voided.status(), lost.status()]).toEqual([502, 502]);
  const voidedId = (await voided.json()).error.details.orderId;
  expect((await lead.post(`/api/orders/${voidedId}/void`, { data: { reason: 'Customer left' } })).status()).toBe(200);
  await cashier.dispose();
  await lead.dispose();

  const context = await browser.newContext({ viewport: { width: 1600, height: 1100 }, baseURL: running.url });
  const page = await context.newPage();
  watchForErrors(page);
  await signIn(page, 'lead', '/reports/cards');
  await page.waitForURL('**/reports/cards');

  await expect(page.getByRole('heading', { name: 'Card check', level: 1 })).toBeVisible();
  const verdict = page.getByTestId('card-check-verdict');
  await expect(verdict).toContainText('1 line needs a look');
  const mismatch = page.locator('[data-testid="charge-line"][data-match="mismatch"]');
  await expect(mismatch).toHaveCount(1);
  await expect(mismatch).toContainText('Answer lost');
  await expect(mismatch).toContainText('Mismatch');
  await expect(page.locator('[data-testid="refund-line"]').filter({ hasText: 'Automatic' })).toContainText(/voided/i);
  await expect(page.locator('[data-testid="refund-line"]').filter({ hasText: 'Theo Brand' })).toContainText('Spilled at the counter');
  await page.screenshot(shot('card-check-mismatch', { fullPage: true }));

  await page.getByRole('button', { name: 'Settle with the card service' }).click();
  await expect(verdict).toContainText('In step');
  await expect(page.locator('[data-testid="charge-line"][data-match="mismatch"]')).toHaveCount(0);
  await expect(page.getByTestId('difference')).toContainText('$0.00');
  await expect(page.getByRole('button', { name: 'Settle with the card service' })).toBeDisabled();
  await page.screenshot(shot('card-check-settled', { fullPage: true }));

  // A reload is rendered on the server with the same numbers; the held webhook changes nothing.
  fake.faults.holdWebhooks(false);
  await fake.webhooksSettled();
  await page.reload();
  await expect(verdict).toContainText('In step');
  await page.screenshot(shot('card-check'));
  expect(errorsOf(page)).toEqual([]);
  await context.close();
});
