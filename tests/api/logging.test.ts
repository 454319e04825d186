// Request logs are structured, carry a request id, and never hold a password, a session id or
// card details — checked by grepping a real run's log lines.
import { randomBytes, randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Knex } from 'knex';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { createLogger } from '@server/logging';
import { startServer } from '@server/server';
import { DEMO_PASSWORD } from '@seeds/demo-cafe';
import { sessionCookieOf } from './helpers';

const lines: string[] = [];
const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-logs-'));
let close: (() => Promise<void>) | undefined;
let runningUrl = '';
let runningDb: Knex;
afterAll(async () => {
  await close?.();
  rmSync(dir, { recursive: true, force: true });
});

describe('request logs', () => {
  it('log each request with an id and nothing secret', async () => {
    const logger = createLogger('info', { write: (line: string) => void lines.push(line) });
    const running = await startServer(
      { env: 'test', port: 0, host: '127.0.0.1', databaseFile: path.join(dir, 'j.sqlite'), sessionSecret: randomBytes(32).toString('hex'), seedDemo: true },
      { pages: 'none', log: () => {}, logger },
    );
    close = running.close;
    runningUrl = running.url;
    runningDb = running.db;
    const agent = request.agent(running.url);
    await agent.post('/api/session').send({ username: 'cashier', password: 'not-the-one-9f3' }).expect(401);
    const signedIn = await agent.post('/api/session').send({ username: 'cashier', password: DEMO_PASSWORD }).expect(200);
    const sid = decodeURIComponent(sessionCookieOf(signedIn).split(';')[0].split('=')[1]);
    const menu = (await agent.get('/api/menu')).body;
    const latte = menu.items.find((i: { name: string }) => i.name === 'Latte').id;
    await agent
      .post('/api/orders')
      .send({
        clientOrderId: randomUUID(),
        customerName: 'Xan Poole',
        items: [{ menuItemId: latte }],
        payment: { method: 'card', paymentMethod: 'pm_card_visa' },
      })
      .expect(201);

    const log = lines.join('');
    const entries = lines.map((l) => JSON.parse(l));
    const requests = entries.filter((e) => e.req);
    expect(requests.length).toBeGreaterThanOrEqual(4);
    for (const e of requests) expect(e.req.id).toMatch(/^[0-9a-f-]{36}$/);
    expect(requests.map((e) => e.res?.statusCode)).toEqual(expect.arrayContaining([401, 200, 201]));
    const rawSessionId = sid.split('.')[0].replace(/^s:/, '');
    expect(rawSessionId.length).toBeGreaterThan(16);
    for (const secret of [DEMO_PASSWORD, 'not-the-one-9f3', sid, rawSessionId, 'pm_card_visa', 'Xan Poole']) {
      expect(log).not.toContain(secret);
    }
  });

  it('log an unexpected error with its stack under the request id, not on stderr', async () => {
    lines.length = 0;
    const agent = request.agent(runningUrl);
    await agent.post('/api/session').send({ username: 'owner', password: DEMO_PASSWORD }).expect(200);
    await runningDb.schema.renameTable('pitchers', 'pitchers_away'); // a fault the code does not expect
    try {
      const res = await agent.get('/api/settings').set('x-request-id', 'trace-me-500');
      expect(res.status).toBe(500);
      expect(res.body.error.code).toBe('internal');
    } finally {
      await runningDb.schema.renameTable('pitchers_away', 'pitchers');
    }
    const entries = lines.map((l) => JSON.parse(l));
    const failure = entries.find((e) => e.msg === 'unexpected error');
    expect(failure).toMatchObject({ level: 50, req: { id: 'trace-me-500' } });
    expect(failure.err.stack).toMatch(/pitchers/);
  });
});
