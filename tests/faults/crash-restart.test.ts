// Crash test: the BUILT server is killed with SIGKILL (its whole process group) in the middle of
// a rush and started again on the same SQLite file and port, three times at three seeded random
// kill points, each on a fresh database. Three counters keep sending cash orders and, like the
// real Counter, retry the SAME clientOrderId after a network error or a 5xx; two bar sockets
// reconnect and resume from the last seq they saw. Afterwards, checked against the database file:
//   - every order the server acknowledged (201 or 200) exists exactly once, under its clientOrderId
//     and with the id that was acknowledged; every logical order the counters sent exists once;
//   - every order has its items and exactly one 'order.fired' event (nothing half-written);
//   - the location's realtime log (events.id) is contiguous from 1 to max — no lost or reused seq;
//   - each bar socket, after a final resume, holds exactly the database's open tickets.
// Loopback only; each run takes a few seconds (two server starts dominate).
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '@server/db/knex';
import { BuiltServer, ensureBuilt, espressoId, freePort, signIn } from './built-server';
import { BarSocket, checkRush, lastSeq, runCounter, seeded, type Ack, type RushResult } from './rush';

const COUNTERS = 3;
const ORDERS_PER_COUNTER = 150;
const TOTAL = COUNTERS * ORDERS_PER_COUNTER;
/** Safety nets so a broken run fails instead of hanging; never timing assertions. */
const RUN_DEADLINE_MS = 120_000;

interface RunResult extends RushResult {
  killAfter: number;
  databaseFile: string;
}

const dirs: string[] = [];

async function crashRun(seed: number): Promise<RunResult> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-faults-'));
  dirs.push(dir);
  const server = new BuiltServer(path.join(dir, 'jugline.sqlite'), await freePort());
  const killAfter = Math.floor(TOTAL * (0.2 + 0.6 * seeded(seed)()));
  const acks: Ack[] = [];
  const problems: string[] = [];
  const bars: BarSocket[] = [];
  let timedOut = false;
  const deadline = setTimeout(() => (timedOut = true), RUN_DEADLINE_MS);
  try {
    await server.start();
    const cookies = await Promise.all(Array.from({ length: COUNTERS }, () => signIn(server.url, 'cashier')));
    const barCookie = await signIn(server.url, 'barista');
    const espresso = await espressoId(server.url, cookies[0]);

    for (let i = 0; i < 2; i++) bars.push(new BarSocket(server.url, barCookie));
    bars.forEach((b) => b.start());

    let reachedKillPoint: () => void = () => {};
    const killPoint = new Promise<void>((resolve) => (reachedKillPoint = resolve));
    let retries = 0;
    const onRetry = () => retries++;
    const onAck = () => {
      if (acks.length >= killAfter) reachedKillPoint();
    };
    const counters = cookies.map((cookie, i) =>
      runCounter({
        orders: ORDERS_PER_COUNTER,
        url: server.url,
        cookie,
        name: `Till ${i + 1}`,
        itemId: espresso,
        acks,
        problems,
        stop: () => timedOut,
        onAck,
        onRetry,
      }),
    );
    const crash = killPoint.then(async () => {
      await server.kill();
      await server.start();
    });
    const sent = (await Promise.all(counters)).flat();
    await crash;
    if (timedOut) problems.push(`run did not finish within ${RUN_DEADLINE_MS} ms (acknowledged ${acks.length}/${TOTAL})`);

    // Every screen reconnects once more and resumes from the last seq it saw.
    const db = createDb(server.databaseFile);
    const max = await lastSeq(db).finally(() => db.destroy());
    for (const bar of bars) await bar.reconnect();
    for (const bar of bars) await bar.until(() => bar.lastSeq >= max, `events up to seq ${max}`);
    return { total: TOTAL, killAfter, retries, acks, sent, problems, bars, databaseFile: server.databaseFile, log: server.log };
  } finally {
    clearTimeout(deadline);
    bars.forEach((b) => b.stop());
    await server.kill();
  }
}

describe('a server killed with SIGKILL mid-rush', () => {
  beforeAll(ensureBuilt, 120_000);

  afterAll(() => {
    for (const dir of dirs) rmSync(dir, { recursive: true, force: true });
  });

  // three kill points from three seeds (each between 20 % and 80 % of the orders), each on a fresh database
  for (const seed of [11, 2026, 90210]) {
    it(`loses, doubles and skips nothing (seed ${seed}, kill after ${Math.floor(TOTAL * (0.2 + 0.6 * seeded(seed)()))} acks)`, async () => {
      const run = await crashRun(seed);
      console.info(
        `kill after ${run.killAfter} acks: ${run.retries} retries, ${run.acks.filter((a) => a.status === 200).length} answered 200 (committed before the kill, reply lost)`,
      );
      for (const bar of run.bars) expect(bar.connects).toBeGreaterThanOrEqual(3); // first connect, after the crash, final resume
      // the server's file after the crash, as another process would see it
      const db = createDb(run.databaseFile);
      await checkRush(db, run).finally(() => db.destroy());
    });
  }
});
