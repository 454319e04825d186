// A group of processes: two processes of the production build on one PostgreSQL and one Redis
// (throwaway servers on loopback ports). Three tills send cash orders, two through process A and
// one through B, retrying the same clientOrderId after a network error or a 5xx; a Bar screen
// watches each process. Mid-rush A is killed with SIGKILL (its whole process group) and started
// again; later Redis is stopped and started again, while the tills go on. Afterwards, against the
// database: every acknowledged order exists once, nothing doubled or half-written, the café's live
// log is contiguous, and both Bars — the one on B saw the whole rush live, across A's death and
// Redis's restart, without a gap or a repeat — hold exactly the open tickets.
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '@server/db/knex';
import { adminQuery, startCluster, type PgCluster } from '@scripts/services/postgres';
import { startRedis, type RedisServer } from '@scripts/services/redis';
import { BuiltServer, ensureBuilt, espressoId, freePort, signIn } from './built-server';
import { BarSocket, checkRush, lastSeq, runCounter, type Ack } from './rush';

const ORDERS_PER_TILL = 60;
const TILLS = 3;
const TOTAL = ORDERS_PER_TILL * TILLS;
/** Safety net so a broken run fails instead of hanging; never a timing assertion. */
const RUN_DEADLINE_MS = 120_000;

let pg: PgCluster | undefined;
let redis: RedisServer | undefined;
const servers: BuiltServer[] = [];
const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-cluster-'));

describe('a group of processes, one killed with SIGKILL and Redis restarted mid-rush', () => {
  beforeAll(ensureBuilt, 120_000);
  afterAll(async () => {
    for (const server of servers) await server.kill();
    await redis?.stop();
    await pg?.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  it('loses, doubles and skips nothing, and every screen converges', async () => {
    pg = await startCluster();
    await adminQuery(pg.adminUrl, 'CREATE DATABASE jugline');
    const cache = await startRedis();
    redis = cache;
    const env = {
      DATABASE_URL: pg.urlOf('jugline'),
      REDIS_URL: cache.url,
      SESSION_SECRET: randomBytes(32).toString('hex'),
      // the first process to start migrates and loads the demo café; the others find it done
      MIGRATE_ON_START: 'true',
    };
    // the database file is never used with DATABASE_URL set
    const [a, b] = [
      new BuiltServer(path.join(dir, 'unused.sqlite'), await freePort(), env),
      new BuiltServer(path.join(dir, 'unused.sqlite'), await freePort(), env),
    ];
    servers.push(a, b);
    await a.start();
    await b.start();

    // sessions live in the database: a sign-in on A is good on B too
    const tills = [a, a, b];
    const cookies = await Promise.all(tills.map((s) => signIn(s.url, 'cashier')));
    const barCookie = await signIn(b.url, 'barista');
    const espresso = await espressoId(a.url, cookies[0]);
    const bars = [new BarSocket(a.url, barCookie), new BarSocket(b.url, barCookie)];
    bars.forEach((bar) => bar.start());

    const acks: Ack[] = [];
    const problems: string[] = [];
    let retries = 0;
    let timedOut = false;
    const deadline = setTimeout(() => (timedOut = true), RUN_DEADLINE_MS);
    const waiting: { at: number; reached: () => void }[] = [];
    const acked = (at: number) => new Promise<void>((reached) => (acks.length >= at ? reached() : waiting.push({ at, reached })));
    const onAck = () => {
      for (const w of waiting.filter((w) => acks.length >= w.at)) w.reached();
    };
    try {
      const counters = cookies.map((cookie, i) =>
        runCounter({
          orders: ORDERS_PER_TILL,
          url: tills[i].url,
          cookie,
          name: `Till ${i + 1}`,
          itemId: espresso,
          acks,
          problems,
          stop: () => timedOut,
          onAck,
          onRetry: () => retries++,
        }),
      );
      const faults = (async () => {
        await acked(TOTAL / 4);
        await a.kill();
        await a.start();
        await acked(TOTAL / 2);
        await cache.down(); // orders still commit; their publishes reach nobody
        await acked(TOTAL / 2 + 20);
        await cache.up();
      })();
      const sent = (await Promise.all(counters)).flat();
      await faults;
      if (timedOut) problems.push(`run did not finish within ${RUN_DEADLINE_MS} ms (acknowledged ${acks.length}/${TOTAL})`);

      const db = createDb(env.DATABASE_URL);
      try {
        const max = await lastSeq(db);
        // the Bar on B got every event live: all of it arrived without a final reconnect
        await bars[1].until(() => bars[1].lastSeq >= max, `events up to seq ${max} on B`);
        expect(bars[1].connects).toBe(1);
        for (const bar of bars) await bar.reconnect();
        for (const bar of bars) await bar.until(() => bar.lastSeq >= max, `events up to seq ${max}`);
        await checkRush(db, { total: TOTAL, retries, acks, sent, problems, bars, log: `A:\n${a.log}\nB:\n${b.log}` });
      } finally {
        await db.destroy();
      }
    } finally {
      clearTimeout(deadline);
      bars.forEach((bar) => bar.stop());
    }
  });
});
