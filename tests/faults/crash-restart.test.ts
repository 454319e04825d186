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
import { randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import WebSocket from 'ws';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ServerMessage, TicketView } from '@/domain/types';
import { BuiltServer, ensureBuilt, freePort, signIn, sleep } from './built-server';

const COUNTERS = 3;
const ORDERS_PER_COUNTER = 150;
const TOTAL = COUNTERS * ORDERS_PER_COUNTER;
const RETRY_MS = 40;
/** Safety nets so a broken run fails instead of hanging; never timing assertions. */
const RUN_DEADLINE_MS = 50_000;

/** mulberry32: a small seeded random, so a failing kill point can be run again. */
function seeded(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

interface Ack {
  clientOrderId: string;
  orderId: number;
  status: number;
}

/** One till: sends its orders one after another, retrying the same clientOrderId until acknowledged. */
async function runCounter(opts: {
  url: string;
  cookie: string;
  name: string;
  itemId: number;
  acks: Ack[];
  problems: string[];
  stop: () => boolean;
  onAck: () => void;
  onRetry: () => void;
}) {
  const sent: string[] = [];
  for (let n = 0; n < ORDERS_PER_COUNTER && !opts.stop(); n++) {
    const clientOrderId = randomUUID();
    sent.push(clientOrderId);
    const body = JSON.stringify({
      clientOrderId,
      customerName: `${opts.name} ${n + 1}`,
      items: [{ menuItemId: opts.itemId }],
      payment: { method: 'cash', tenderedCents: 10_00 },
    });
    for (;;) {
      if (opts.stop()) return sent;
      let res: Response;
      try {
        res = await fetch(`${opts.url}/api/orders`, {
          method: 'POST',
          headers: { 'content-type': 'application/json', cookie: opts.cookie },
          body,
          signal: AbortSignal.timeout(10_000),
        });
      } catch {
        opts.onRetry();
        await sleep(RETRY_MS); // refused, reset or timed out: the server is down or restarting
        continue;
      }
      const text = await res.text().catch(() => null);
      if (text === null || res.status >= 500) {
        opts.onRetry();
        await sleep(RETRY_MS);
        continue;
      }
      if (res.status !== 200 && res.status !== 201) {
        opts.problems.push(`${opts.name} order ${n + 1}: ${res.status} ${text}`);
        return sent;
      }
      const order = JSON.parse(text) as { order?: { id: number; clientOrderId: string } } & { id?: number; clientOrderId?: string };
      const view = order.order ?? (order as { id: number; clientOrderId: string });
      if (view.clientOrderId !== clientOrderId) opts.problems.push(`${opts.name}: answered with another order's id ${view.clientOrderId}`);
      opts.acks.push({ clientOrderId, orderId: view.id, status: res.status });
      opts.onAck();
      break;
    }
  }
  return sent;
}

/** A bar screen: connects, resumes from the last seq it saw, keeps the open tickets, reconnects on drops. */
class BarSocket {
  lastSeq = 0;
  open = new Map<number, TicketView>();
  snapshots = 0;
  connects = 0;
  /** The seq each connection's hello reported, in order. */
  hellos: number[] = [];
  problems: string[] = [];
  private socket: WebSocket | null = null;
  private stopped = false;
  private waiters = new Set<() => void>();

  constructor(
    private url: string,
    private cookie: string,
  ) {}

  start() {
    this.connect();
  }

  private connect() {
    if (this.stopped) return;
    const socket = new WebSocket(`${this.url.replace(/^http/, 'ws')}/ws`, { headers: { Cookie: this.cookie } });
    this.socket = socket;
    socket.on('open', () => this.connects++);
    socket.on('message', (data) => {
      const m = JSON.parse(data.toString()) as ServerMessage;
      if (m.type === 'hello') {
        this.hellos.push(m.seq);
        socket.send(JSON.stringify({ type: 'resume', since: this.lastSeq }));
      } else if (m.type === 'snapshot') {
        this.snapshots++;
        this.open = new Map(m.snapshot.tickets.filter((t) => t.status === 'open').map((t) => [t.id, t]));
        this.lastSeq = m.snapshot.seq;
      } else if (m.type === 'event') {
        const e = m.event;
        if (e.seq !== this.lastSeq + 1) this.problems.push(`seq ${e.seq} after ${this.lastSeq}`);
        if (e.seq <= this.lastSeq) return;
        this.lastSeq = e.seq;
        if ('ticket' in e) {
          if (e.ticket.status === 'open') this.open.set(e.ticket.id, e.ticket);
          else this.open.delete(e.ticket.id);
        }
      } else if (m.type === 'error') this.problems.push(`server error message: ${m.code} ${m.message}`);
      for (const wake of [...this.waiters]) wake();
    });
    socket.on('error', () => {}); // refused while the server is down; 'close' follows
    socket.on('close', () => {
      if (this.socket === socket) this.socket = null;
      if (!this.stopped) setTimeout(() => this.connect(), 50);
    });
  }

  /** Resolves once `done()` holds (checked on every message). */
  until(done: () => boolean, what: string, ms = 15_000): Promise<void> {
    return new Promise((resolve, reject) => {
      const check = () => {
        if (!done()) return;
        clearTimeout(timer);
        this.waiters.delete(check);
        resolve();
      };
      const timer = setTimeout(() => {
        this.waiters.delete(check);
        reject(new Error(`bar socket: no ${what} within ${ms} ms (at seq ${this.lastSeq})`));
      }, ms);
      this.waiters.add(check);
      check();
    });
  }

  /** A final reconnect and resume from the last seq seen; resolves on the new connection's hello. */
  async reconnect() {
    const before = this.hellos.length;
    const old = this.socket;
    if (old) old.close();
    else this.connect();
    await this.until(() => this.hellos.length > before, 'hello after the final reconnect');
  }

  stop() {
    this.stopped = true;
    this.socket?.terminate();
    for (const wake of [...this.waiters]) wake();
  }
}

interface RunResult {
  killAfter: number;
  retries: number;
  acks: Ack[];
  sent: string[];
  problems: string[];
  bars: BarSocket[];
  databaseFile: string;
  log: string;
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
    const menu = (await (await fetch(`${server.url}/api/menu`, { headers: { cookie: cookies[0] } })).json()) as {
      items: { id: number; name: string }[];
    };
    const espresso = menu.items.find((i) => i.name === 'Espresso');
    if (!espresso) throw new Error('the demo menu has no Espresso');

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
      runCounter({ url: server.url, cookie, name: `Till ${i + 1}`, itemId: espresso.id, acks, problems, stop: () => timedOut, onAck, onRetry }),
    );
    const crash = killPoint.then(async () => {
      await server.kill();
      await server.start();
    });
    const sent = (await Promise.all(counters)).flat();
    await crash;
    if (timedOut) problems.push(`run did not finish within ${RUN_DEADLINE_MS} ms (acknowledged ${acks.length}/${TOTAL})`);

    // Every screen reconnects once more and resumes from the last seq it saw.
    const db = new Database(server.databaseFile, { readonly: true, fileMustExist: true });
    const max = (db.prepare('SELECT max(id) AS m FROM events').get() as { m: number }).m;
    db.close();
    for (const bar of bars) await bar.reconnect();
    for (const bar of bars) await bar.until(() => bar.lastSeq >= max, `events up to seq ${max}`);
    return { killAfter, retries, acks, sent, problems, bars, databaseFile: server.databaseFile, log: server.log };
  } finally {
    clearTimeout(deadline);
    bars.forEach((b) => b.stop());
    await server.kill();
  }
}

function check(run: RunResult) {
  const { acks, sent, databaseFile } = run;
  expect(run.problems, run.log).toEqual([]);
  expect(acks.length).toBe(TOTAL);
  expect(run.retries, 'the crash happened while the counters were sending').toBeGreaterThan(0);
  console.info(
    `kill after ${run.killAfter} acks: ${run.retries} retries, ${acks.filter((a) => a.status === 200).length} answered 200 (committed before the kill, reply lost)`,
  );
  expect(new Set(sent).size).toBe(TOTAL);

  // The server's file after the crash — opened read-only, as another process would see it.
  const db = new Database(databaseFile, { readonly: true, fileMustExist: true });
  try {
    const [{ id: locationId }] = db.prepare("SELECT location_id AS id FROM users WHERE username = 'cashier'").all() as { id: number }[];
    const orders = db.prepare('SELECT id, client_order_id, status FROM orders WHERE location_id = ?').all(locationId) as {
      id: number;
      client_order_id: string;
      status: string;
    }[];
    const byClientId = new Map<string, number[]>();
    for (const o of orders) byClientId.set(o.client_order_id, [...(byClientId.get(o.client_order_id) ?? []), o.id]);

    // every acknowledged order exists exactly once, with the id the counter was told
    for (const a of acks) expect(byClientId.get(a.clientOrderId), `acknowledged ${a.clientOrderId}`).toEqual([a.orderId]);
    // one logical order (one clientOrderId, however often it was retried) is one row; nothing else got in
    expect([...byClientId.values()].filter((ids) => ids.length > 1)).toEqual([]);
    expect(new Set(orders.map((o) => o.client_order_id))).toEqual(new Set(sent));
    // each order the counter was told about was acknowledged once per logical order
    expect(new Set(acks.map((a) => a.clientOrderId)).size).toBe(acks.length);

    // nothing half-written: items and exactly one order.fired event per order
    const itemless = db
      .prepare('SELECT o.id FROM orders o LEFT JOIN order_items i ON i.order_id = o.id WHERE o.location_id = ? AND i.id IS NULL')
      .all(locationId);
    expect(itemless).toEqual([]);
    const fired = db
      .prepare("SELECT json_extract(payload, '$.ticket.id') AS orderId, count(*) AS n FROM events WHERE location_id = ? AND type = 'order.fired' GROUP BY 1")
      .all(locationId) as { orderId: number; n: number }[];
    const firedCount = new Map(fired.map((f) => [f.orderId, f.n]));
    expect(orders.filter((o) => firedCount.get(o.id) !== 1).map((o) => o.id)).toEqual([]);
    const paid = db
      .prepare("SELECT count(*) AS n FROM payments p JOIN orders o ON o.id = p.order_id WHERE o.location_id = ? AND p.status = 'succeeded'")
      .get(locationId) as {
      n: number;
    };
    expect(paid.n).toBe(orders.length);

    // the realtime log is contiguous: seq 1..max, no gap a resuming screen would silently skip
    const ids = (db.prepare('SELECT id FROM events WHERE location_id = ? ORDER BY id').all(locationId) as { id: number }[]).map((r) => r.id);
    expect(ids.length).toBeGreaterThanOrEqual(TOTAL);
    const gaps = ids.filter((id, i) => id !== i + 1);
    expect(gaps.slice(0, 5), 'first events whose id is not its position').toEqual([]);

    // each resumed bar screen holds exactly the open tickets
    const open = (db.prepare("SELECT id FROM orders WHERE location_id = ? AND status = 'open' ORDER BY id").all(locationId) as { id: number }[]).map(
      (r) => r.id,
    );
    expect(open.length).toBeGreaterThan(0);
    for (const bar of run.bars) {
      expect(bar.problems).toEqual([]);
      expect(bar.connects).toBeGreaterThanOrEqual(3); // first connect, after the crash, final resume
      expect(bar.lastSeq).toBe(ids.at(-1));
      // the final connection's hello names the log's end, and the screen had already seen all of it
      // (the resume from lastSeq replays nothing missing), so its board is final
      expect(bar.hellos.at(-1)).toBe(ids.at(-1));
      expect([...bar.open.keys()].sort((a, b) => a - b)).toEqual(open);
    }
  } finally {
    db.close();
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
      check(await crashRun(seed));
    });
  }
});
