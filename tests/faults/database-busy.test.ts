// The BUILT server (e2e/serve.ts, NODE_ENV=production, the real 5 s busy timeout) while another
// process holds the SQLite write lock on its file. Before, the first request of a session ended
// with connect-session-knex's `touch` rejecting SQLITE_BUSY unhandled, and Node ended the process:
// every screen went dark and nothing restarted it. Now: the read is served, each write answers
// 503 with Retry-After, and the same process (never restarted here) serves again once the lock
// ends, with the order the Counter resent stored once.
import { randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { holdWriteLock } from '../support/db-lock';
import { BuiltServer, ensureBuilt, freePort, signIn } from './built-server';

const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-busy-'));
let server: BuiltServer;

beforeAll(async () => {
  ensureBuilt();
  server = new BuiltServer(path.join(dir, 'jugline.sqlite'), await freePort());
  await server.start();
}, 150_000);
afterAll(async () => {
  await server?.kill();
  rmSync(dir, { recursive: true, force: true });
});

function call(method: string, url: string, cookie: string, body?: unknown) {
  return fetch(url, {
    method,
    headers: { cookie, ...(body ? { 'content-type': 'application/json' } : {}) },
    body: body ? JSON.stringify(body) : undefined,
  });
}

async function expectBusy(res: Response, what: string) {
  expect(res.status, what).toBe(503);
  expect(Number(res.headers.get('retry-after')), `${what}: Retry-After`).toBeGreaterThan(0);
  expect(await res.json(), what).toEqual({ error: { code: 'unavailable', message: expect.stringMatching(/busy/i) } });
}

const storedOrders = (clientOrderId: string) => {
  const db = new Database(server.databaseFile, { readonly: true, fileMustExist: true });
  try {
    return (db.prepare('SELECT count(*) AS n FROM orders WHERE client_order_id = ?').get(clientOrderId) as { n: number }).n;
  } finally {
    db.close();
  }
};

describe('the built server under a write lock held by another process', () => {
  it('stays up: reads served, writes 503 with Retry-After, all back once the lock ends', async () => {
    const cookie = await signIn(server.url, 'cashier');
    const menu = (await (await call('GET', `${server.url}/api/menu`, cookie)).json()) as { items: { id: number; name: string }[] };
    const espresso = menu.items.find((i) => i.name === 'Espresso')!;
    const order = {
      clientOrderId: randomUUID(),
      customerName: 'Ada Quill',
      items: [{ menuItemId: espresso.id }],
      payment: { method: 'cash', tenderedCents: 10_00 },
    };
    const fresh = await signIn(server.url, 'cashier'); // its first request touches its session row

    const lock = await holdWriteLock(server.databaseFile);
    try {
      const read = await call('GET', `${server.url}/api/menu`, fresh);
      expect(read.status).toBe(200);
      expect(((await read.json()) as { items: unknown[] }).items.length).toBeGreaterThan(0);
      await expectBusy(await call('POST', `${server.url}/api/orders`, cookie, order), 'an order');
      await expectBusy(await call('DELETE', `${server.url}/api/session`, fresh), 'sign-out');
    } finally {
      await lock.release();
    }
    expect(server.ended, server.log).toBeNull();

    expect(storedOrders(order.clientOrderId)).toBe(0);
    expect((await call('POST', `${server.url}/api/orders`, cookie, order)).status).toBe(201);
    expect((await call('POST', `${server.url}/api/orders`, cookie, order)).status).toBe(200);
    expect(storedOrders(order.clientOrderId)).toBe(1);
    expect((await call('DELETE', `${server.url}/api/session`, fresh)).status).toBe(204);
    expect(server.ended, server.log).toBeNull();
  });
});
