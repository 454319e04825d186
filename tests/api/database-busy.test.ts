// Another program holds the SQLite write lock (tests/support/db-lock.ts: a second process in
// BEGIN EXCLUSIVE; on PostgreSQL, one holding every table in EXCLUSIVE mode). Once the busy timeout
// runs out SQLite answers SQLITE_BUSY (PostgreSQL: lock_timeout, 55P03); every request that
// must write then answers 503 with Retry-After in the app's error shape, changes nothing, and
// the same process serves again, with nothing lost, once the lock ends. A process that dies, or an
// unhandled rejection, fails this file (Vitest reports unhandled errors); so does a console.error.
// The busy timeout is cut to 100 ms here only so each refusal does not wait 5 s: the path is the
// same (tests/faults/database-busy.test.ts runs the built server on the real 5 s).
import request from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, DEMO_PINS } from '@seeds/demo-cafe';
import { holdWriteLock } from '../support/db-lock';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { closeAllSockets, connect, tryUpgrade } from '../realtime/ws-client';
import { orderBody, writeCounts } from './helpers';

const MIN = 60_000;
const time = manualClock('2026-03-02T14:00:00.000Z');
let server: TestServer;
beforeAll(async () => {
  server = await startTestServer({ sessionClock: time.clock, dbBusyTimeoutMs: 100 });
});
afterEach(() => closeAllSockets());
afterAll(() => server.close());

const idOf = async (username: string) => (await server.db('users').where({ username }).first('id')).id as number;
const sessionIds = async () => (await server.db('sessions').orderBy('sid').select('sid', 'sess')).map((r) => `${r.sid} ${r.sess}`);
const signInAs = (username: string) => request(server.url).post('/api/session').send({ username, password: DEMO_PASSWORD });

function expectBusy(res: request.Response, what: string) {
  expect(res.status, what).toBe(503);
  expect(Number(res.headers['retry-after']), `${what}: Retry-After`).toBeGreaterThan(0);
  expect(res.body, what).toEqual({ error: { code: 'unavailable', message: expect.stringMatching(/busy/i) } });
}

describe('a database locked by another process', () => {
  it('sign-in, activity, a timed-out session (HTTP and socket), PIN switch, an order and sign-out answer 503; then all work, nothing lost', async () => {
    const ids = await demoMenu(server);
    const timedOut = await server.cookieFor('cashier');
    const timedOutMenu = () => request(server.url).get('/api/menu').set('Cookie', timedOut);
    time.advance(29 * MIN);
    const idle = await server.signIn('cashier'); // untouched for two minutes below: its next request is activity
    time.advance(2 * MIN);
    const terminal = await server.signIn('cashier'); // signed in just now: nothing to write on a read
    const lead = await server.signIn('lead');
    const bar = await connect(server.url, await server.cookieFor('barista'));
    const hello = (await bar.next((m) => m.type === 'hello', 'hello')) as { seq: number };
    bar.send({ type: 'resume', since: hello.seq });
    const order = orderBody('Ada Quill', [{ menuItemId: ids.item('Long black') }]);
    const switchTo = { userId: await idOf('barista'), pin: DEMO_PINS.barista };

    const rows = await writeCounts(server);
    const sessions = await sessionIds();
    const lock = await holdWriteLock(server.databaseTarget);
    try {
      expectBusy(await signInAs('barista'), 'sign-in');
      expectBusy(await idle.get('/api/menu'), 'the first request after two idle minutes');
      expectBusy(await timedOutMenu(), 'a session past its idle limit');
      // the live socket's upgrade ends a timed-out session too: 503 there as well, not 500
      expect(await tryUpgrade(server.url, { Cookie: timedOut })).toEqual({ opened: false, status: 503 });
      expectBusy(await terminal.post('/api/session/switch').send(switchTo), 'PIN switch');
      expectBusy(await terminal.post('/api/orders').send(order), 'an order');
      expectBusy(await lead.delete('/api/session'), 'sign-out');
      // a request with nothing to write is served: WAL readers go on beside the lock holder
      expect((await terminal.get('/api/menu')).status).toBe(200);
      expect((await lead.get('/api/session')).body.user).toMatchObject({ role: 'lead' });
    } finally {
      await lock.release();
    }

    // the refusals changed nothing: no order, no event, every session row as it was
    expect(await writeCounts(server)).toEqual(rows);
    expect(await sessionIds()).toEqual(sessions);

    // the same process serves again, and every session is where it was
    expect((await idle.get('/api/menu')).status).toBe(200);
    expect((await timedOutMenu()).status).toBe(401);
    expect((await lead.get('/api/session')).body.user).toMatchObject({ role: 'lead' });
    expect((await signInAs('barista')).status).toBe(200);

    // the Counter resends the same order (src/features/counter/use-offline-orders.ts): stored once
    const placed = await terminal.post('/api/orders').send(order);
    expect(placed.status).toBe(201);
    expect((await terminal.post('/api/orders').send(order)).status).toBe(200);
    expect(Number((await server.db('orders').where({ client_order_id: order.clientOrderId }).count({ n: '*' }).first())?.n)).toBe(1);
    // the Bar's live socket, open all along, gets the order
    expect(await bar.nextEvent('order.fired')).toMatchObject({ type: 'order.fired' });

    expect((await terminal.post('/api/session/switch').send(switchTo)).status).toBe(200);
    expect((await lead.delete('/api/session')).status).toBe(204);
  });
});
