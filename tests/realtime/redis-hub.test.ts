// Several processes of one café share live events through Redis (server/realtime/redis-hub.ts):
// three servers on one database and one real redis-server (Debian's, on a loopback port), and
// Debian's nginx in front of them with deploy/nginx.conf. Orders
// taken on two of them at once reach a Bar on the third, every event once, in sequence order, as
// the events table has them — also when a publish is lost and when Redis restarts mid-rush.
import request from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { LiveEvent } from '@/domain/types';
import { appendMenuChangedEvent, latestSeq, runCommand } from '@server/events';
import type { Hub } from '@server/realtime/hub';
import { WRONG_PASSWORDS_PER_PERSON } from '@server/team/routes';
import { startNginx } from '@scripts/services/nginx';
import { startRedis, type RedisServer } from '@scripts/services/redis';
import { DEMO_PASSWORD, SECOND_CAFE_NAME } from '@seeds/demo-cafe';
import { FREE_FAILURES, PAIR_FAILURES_PER_HOUR } from '@/domain/sign-in-pacing';
import { startTestServer, type TestServer } from '../support/test-server';
import { sidOf } from '../api/helpers';
import { SESSION_COOKIE } from '@server/auth/session';
import { demoLines, demoLocationId, fireOrder, loggedEvents } from './bar-actions';
import { closeAllSockets, connect, connectAndResume, type LiveClient } from './ws-client';

let redis: RedisServer;
let a: TestServer;
let b: TestServer;
let c: TestServer;
let locationId: number;

beforeAll(async () => {
  redis = await startRedis();
  a = await startTestServer({ redisUrl: redis.url });
  b = await startTestServer({ redisUrl: redis.url, sharing: a });
  c = await startTestServer({ redisUrl: redis.url, sharing: a });
  locationId = await demoLocationId(a);
});
afterEach(() => closeAllSockets());
afterAll(async () => {
  for (const server of [c, b, a]) await server?.close();
  await redis?.stop();
});

/** Events the screen receives until it has seen `last`; every one of them, in arrival order. */
async function eventsUntil(client: LiveClient, last: number): Promise<LiveEvent[]> {
  for (;;) {
    const seen = client.events();
    if (seen.length > 0 && seen[seen.length - 1].seq >= last) return seen;
    await client.nextEvent();
  }
}

/** The screen got exactly the table's events after `from`, in order, each once. */
async function expectContiguous(received: LiveEvent[], from: number, to: number) {
  const seqs = received.map((e) => e.seq);
  expect(seqs).toEqual(Array.from({ length: to - from }, (_, i) => from + 1 + i));
  const table = (await loggedEvents(a, locationId)).filter((e) => e.seq > from && e.seq <= to);
  expect(received.map((e) => [e.seq, e.type])).toEqual(table.map((e) => [e.seq, e.type]));
}

describe('live events across processes', () => {
  it('orders taken on two processes at once reach a Bar on a third: every event, in order, once', async () => {
    // the Bar resumes from where the café is now; everything after comes live
    const { client: bar, hello } = await connectAndResume(c.url, await c.cookieFor('barista'));
    const start = hello.seq;
    const lines = await demoLines(a);
    const [counterA, counterB] = [await a.signIn('cashier'), await b.signIn('cashier')];
    await Promise.all(
      Array.from({ length: 12 }, (_, i) => fireOrder(i % 2 ? counterA : counterB, `Guest ${i + 1}`, [i % 3 ? lines.latte() : lines.flatWhite()])),
    );
    const end = await latestSeq(a.db, locationId);
    expect(end - start).toBe(12);
    await expectContiguous(
      (await eventsUntil(bar, end)).filter((e) => e.seq > start),
      start,
      end,
    );
  });

  it('a publish that never reaches Redis is filled from the events table, in its place', async () => {
    const { client: bar, hello } = await connectAndResume(b.url, await b.cookieFor('barista'));
    const start = hello.seq;
    const counter = await a.signIn('cashier');
    const lines = await demoLines(a);
    // once this order's event is on the Bar, its socket is live: what follows comes only live
    await fireOrder(counter, 'Before the gap', [lines.espresso()]);
    await eventsUntil(bar, start + 1);
    // a command whose event is committed but never published (as if the process died right then)
    const silent: Hub = { publish: () => {}, subscribe: () => () => {} };
    await runCommand({ ...a.deps, hub: silent }, async (trx) => ({
      result: null,
      events: [await appendMenuChangedEvent(trx, locationId, new Date().toISOString(), null)],
    }));
    // the next event does travel, and shows the gap to the Bar's process
    await fireOrder(counter, 'After the gap', [lines.espresso()]);
    const end = await latestSeq(a.db, locationId);
    expect(end - start).toBe(3);
    await expectContiguous(
      (await eventsUntil(bar, end)).filter((e) => e.seq > start),
      start,
      end,
    );
  });

  it('signing out on one process closes that session’s screens on the others at once (4401)', async () => {
    const cookie = await a.cookieFor('barista');
    const onB = await connect(b.url, cookie);
    const onC = await connect(c.url, cookie);
    const bystander = await connect(c.url, await c.cookieFor('lead'));
    for (const client of [onB, onC, bystander]) await client.next((m) => m.type === 'hello');
    const closed = (client: LiveClient) => new Promise<number>((resolve) => client.socket.once('close', (code) => resolve(code)));
    const [closedB, closedC] = [closed(onB), closed(onC)];
    // the news itself reaches the other processes (their heartbeat would only notice later)
    const told = (server: TestServer) => new Promise<unknown>((resolve) => server.deps.sessions.once('signed-out', resolve));
    const [toldB, toldC] = [told(b), told(c)];
    await request(a.url).delete('/api/session').set('Cookie', cookie).expect(204);
    await Promise.all([toldB, toldC]);
    expect(await Promise.all([closedB, closedC])).toEqual([4401, 4401]);
    bystander.send({ type: 'ping' });
    expect((await bystander.next((m) => m.type === 'pong')).type).toBe('pong');
  });

  it('an owner choosing another café on one process makes that session’s screens on the others load again (4412)', async () => {
    const cookie = await a.cookieFor('owner');
    const onB = await connect(b.url, cookie);
    await onB.next((m) => m.type === 'hello');
    const closed = new Promise<number>((resolve) => onB.socket.once('close', (code) => resolve(code)));
    const ropewalk = (await a.db('locations').where({ name: SECOND_CAFE_NAME }).first('id')).id as number;
    await request(a.url).post('/api/session/cafe').set('Cookie', cookie).send({ locationId: ropewalk }).expect(200);
    expect(await closed).toBe(4412);
    // reconnecting on B, the session now works on Ropewalk: hello at Ropewalk's sequence
    const again = await connect(b.url, cookie);
    expect(await again.next((m) => m.type === 'hello')).toEqual({ type: 'hello', seq: await latestSeq(a.db, ropewalk) });
  });

  it('behind nginx (deploy/nginx.conf as it is): orders and a Bar through one address, every event in order', async () => {
    const nginx = await startNginx([a, b, c].map((s) => Number(new URL(s.url).port)));
    try {
      // sessions live in the database: each request may land on any process
      const counter = request.agent(nginx.url);
      await counter.post('/api/session').send({ username: 'cashier', password: DEMO_PASSWORD }).expect(200);
      const signIn = await request(nginx.url).post('/api/session').send({ username: 'barista', password: DEMO_PASSWORD }).expect(200);
      const cookie = ([] as string[])
        .concat(signIn.headers['set-cookie'])
        .map((x) => x.split(';')[0])
        .join('; ');
      const { client: bar, hello } = await connectAndResume(nginx.url, cookie);
      const start = hello.seq;
      const lines = await demoLines(a);
      await Promise.all(Array.from({ length: 9 }, (_, i) => fireOrder(counter, `Through nginx ${i + 1}`, [i % 2 ? lines.latte() : lines.espresso()])));
      const end = await latestSeq(a.db, locationId);
      expect(end - start).toBe(9);
      await expectContiguous(
        (await eventsUntil(bar, end)).filter((e) => e.seq > start),
        start,
        end,
      );
    } finally {
      await closeAllSockets();
      await nginx.stop();
    }
  });

  it('sign-in failures and wrong passwords count once across processes: pacing and limits hold wherever an attempt lands', async () => {
    const slept: number[] = [];
    const pacing = { sleep: async (ms: number) => void slept.push(ms) }; // a turn's wait, recorded instead of waited
    const x = await startTestServer({ redisUrl: redis.url, sharing: a, signInPacing: pacing });
    const y = await startTestServer({ redisUrl: redis.url, sharing: a, signInPacing: pacing });
    try {
      const guess = (server: TestServer) => request(server.url).post('/api/session').send({ username: 'nobody-here', password: 'a wrong guess' });
      for (let i = 0; i < FREE_FAILURES; i++) expect((await guess(x)).status).toBe(401);
      expect(slept).toEqual([]);
      // y has seen no failure itself, yet the name's next attempt waits its turn there
      expect((await guess(y)).status).toBe(401);
      expect(slept).toHaveLength(1);
      for (let n = FREE_FAILURES + 1; n < PAIR_FAILURES_PER_HOUR; n++) expect((await guess(n % 2 ? x : y)).status).toBe(401);
      const refused = await guess(x);
      expect(refused.status).toBe(429);
      expect(refused.body.error.message).toMatch(/for this name from this address/);
      expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0);
    } finally {
      await y.close();
      await x.close();
    }
    // setting one's own PIN: the wrong passwords of one person add up on all three processes
    const cookie = await a.cookieFor('barista2');
    const wrongPassword = (server: TestServer) =>
      request(server.url).put('/api/me/pin').set('Cookie', cookie).send({ password: 'not my password', pin: '480262' });
    for (let i = 0; i < WRONG_PASSWORDS_PER_PERSON; i++) expect((await wrongPassword([a, b, c][i % 3])).status).toBe(401);
    expect((await wrongPassword(c)).status).toBe(429);
  });

  // last: the processes' Redis connections come back on their own clock after this one
  it('Redis down mid-rush loses nothing: what was taken meanwhile reaches the Bar once Redis is back', async () => {
    const { client: bar, hello } = await connectAndResume(c.url, await c.cookieFor('barista'));
    const start = hello.seq;
    const lines = await demoLines(a);
    const counter = await a.signIn('cashier');
    for (let i = 0; i < 3; i++) await fireOrder(counter, `Before ${i + 1}`, [lines.latte()]);
    await eventsUntil(bar, start + 3); // live now
    // a screen on B whose session ends while Redis is away, by a process that never gets to say so
    const leaving = await a.cookieFor('barista2');
    const onB = await connect(b.url, leaving);
    await onB.next((m) => m.type === 'hello');
    const closedOnB = new Promise<number>((resolve) => onB.socket.once('close', (code) => resolve(code)));
    await redis.down();
    // taken while Redis is away: committed, published to nobody
    for (let i = 0; i < 3; i++) await fireOrder(counter, `Meanwhile ${i + 1}`, [lines.flatWhite()]);
    await b.signIn('lead'); // sign-in pacing counts in the process meanwhile, and lets people in
    await a
      .db('sessions')
      .where({ sid: sidOf(leaving.split('; ').find((c) => c.startsWith(`${SESSION_COOKIE}=`))!) })
      .delete();
    await redis.up();
    // B checks its screens' sessions once it is back on Redis, not only at the next heartbeat
    expect(await closedOnB).toBe(4401);
    // nothing more is taken: only the Bar's process catching up from the table can bring these
    const end = await latestSeq(a.db, locationId);
    expect(end - start).toBe(6);
    await expectContiguous(
      (await eventsUntil(bar, end)).filter((e) => e.seq > start),
      start,
      end,
    );
  });
});
