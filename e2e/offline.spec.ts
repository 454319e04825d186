// The server goes away as the cashier presses Send: the Counter keeps the order in the browser,
// says it is not sent yet, and sends it by itself, once, when the server is back.
// This test runs its own server (not Playwright's webServer) so it can kill it and start it again
// on the same database file, the way a crashed or restarted café server comes back.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { request as apiRequest, type BrowserContext } from '@playwright/test';
import { DEMO_PASSWORD, expect, signIn, test } from './fixtures';

let dir = '';
let databaseFile = '';
let port = 0;
let baseURL = '';
let server: ChildProcess | null = null;
let serverLog = '';

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port: p } = s.address() as { port: number };
      s.close(() => resolve(p));
    });
  });
}

const sessionAnswers = () =>
  fetch(`${baseURL}/api/session`).then(
    (r) => r.status,
    () => 0,
  );

async function startServer() {
  const child = spawn('node_modules/.bin/tsx', ['e2e/serve.ts'], {
    detached: true, // its own process group: tsx and the node it runs stop together
    env: { ...process.env, E2E_PORT: String(port), E2E_DATABASE_FILE: databaseFile },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout?.on('data', (d) => (serverLog += d));
  child.stderr?.on('data', (d) => (serverLog += d));
  server = child;
  await expect.poll(sessionAnswers, { timeout: 60_000, message: `server did not start:\n${serverLog}` }).toBe(200);
}

async function killServer() {
  const child = server;
  if (!child?.pid || child.exitCode !== null || child.signalCode !== null) return;
  server = null;
  const exited = new Promise((resolve) => child.once('exit', resolve));
  process.kill(-child.pid, 'SIGKILL'); // only the group this test started
  await exited;
  await expect.poll(sessionAnswers, { message: 'server still answering after kill' }).toBe(0);
}

// Expected while the server is down: the failed fetch of the order and the socket's reconnects.
const expectedWhileDown = [/Failed to load resource: net::ERR_CONNECTION_REFUSED/, /WebSocket connection to 'ws:\/\/.*' failed/];

test.describe('Counter with the server gone', () => {
  let context: BrowserContext;

  test.beforeAll(async ({ browser }) => {
    dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-e2e-offline-'));
    databaseFile = path.join(dir, 'jugline.sqlite'); // kept across the restart, sessions too
    port = await freePort();
    baseURL = `http://127.0.0.1:${port}`;
    await startServer();
    context = await browser.newContext({ baseURL, viewport: { width: 1280, height: 800 } });
  });

  test.afterAll(async () => {
    await context?.close();
    await killServer();
    if (dir) rmSync(dir, { recursive: true, force: true });
  });

  test('an order sent while the server is down waits in the browser and goes once when it is back', async () => {
    test.setTimeout(120_000);
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    page.on('console', (m) => {
      if (m.type() === 'error' && !expectedWhileDown.some((re) => re.test(m.text()))) errors.push(m.text());
    });

    await signIn(page, 'cashier', '/counter');
    await page.waitForURL('**/counter');
    await expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
    // a marker that a reload would wipe: the order must go without one
    await page.evaluate(() => ((window as unknown as { marker: number }).marker = 42));

    await page.getByRole('button', { name: /^Espresso/ }).click();
    await page.getByRole('button', { name: /Add to order/ }).click();
    await expect(page.getByTestId('order-line')).toHaveCount(1);
    await page.getByLabel('Name for the cup').fill('Wren Ashby');

    await killServer();
    await page.getByRole('button', { name: /^Send/ }).click();

    const banner = page.getByTestId('pending-orders');
    await expect(banner).toContainText('1 order not sent yet — will send when the server is back');
    await expect(banner.getByTestId('pending-order')).toHaveText([/Wren Ashby.*\$\d+\.\d\d.*Not sent yet/]);
    await expect(banner.getByRole('button', { name: 'Send now' })).toBeVisible();
    // taken like a sent order: the form is clear for the next customer, and no error or "Sent"
    await expect(page.getByTestId('order-line')).toHaveCount(0);
    await expect(page.getByLabel('Name for the cup')).toHaveValue('');
    await expect(page.getByRole('alert')).toHaveCount(0);
    await expect(page.getByRole('status').filter({ hasText: /Sent #/ })).toHaveCount(0);
    // it is in IndexedDB, not only in the page
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

    await startServer();
    // sent by itself (backoff timer, 'online' or the socket's reconnect), without a reload
    await expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible({ timeout: 30_000 });
    await expect(banner).toHaveCount(0, { timeout: 45_000 });
    expect(await page.evaluate(() => (window as unknown as { marker?: number }).marker)).toBe(42);

    const api = await apiRequest.newContext({ baseURL });
    const signedIn = await api.post('/api/session', { data: { username: 'cashier', password: DEMO_PASSWORD } });
    expect(signedIn.ok()).toBe(true);
    const res = await api.get('/api/tickets?status=open');
    expect(res.ok()).toBe(true);
    const { tickets } = (await res.json()) as { tickets: { customerName: string }[] };
    expect(tickets.filter((t) => t.customerName === 'Wren Ashby')).toHaveLength(1);
    await api.dispose();

    expect(errors).toEqual([]);
  });
});
