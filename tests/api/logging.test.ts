// Request logs are structured, carry a request id, and never hold a password, a session id or
// card details — checked by grepping a real run's log lines.
import { randomBytes, randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { createLogger } from '@server/logging';
import { startServer } from '@server/server';
import { DEMO_PASSWORD } from '@seeds/demo-cafe';
import { sessionCookieOf } from './helpers';

const lines: string[] = [];
const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-logs-'));
let close: (() => Promise<void>) | undefined;
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
});
