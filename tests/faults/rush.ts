// A rush for the fault tests: tills that send cash orders and, like the real Counter, retry the
// SAME clientOrderId after a network error or a 5xx; bar screens that reconnect and resume from
// the last seq they saw; and the check, against the database, that the rush lost, doubled and
// skipped nothing. Used on one process (crash-restart) and on a group of them (cluster-kill).
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import WebSocket from 'ws';
import { expect } from 'vitest';
import type { ServerMessage, TicketView } from '@/domain/types';
import { sleep } from './built-server';

const RETRY_MS = 40;

/** mulberry32: a small seeded random, so a failing kill point can be run again. */
export function seeded(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export interface Ack {
  clientOrderId: string;
  orderId: number;
  status: number;
}

/** One till: sends its orders one after another, retrying the same clientOrderId until acknowledged. */
export async function runCounter(opts: {
  /** Orders this till sends, one after another. */
  orders: number;
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
  for (let n = 0; n < opts.orders && !opts.stop(); n++) {
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
export class BarSocket {
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

export interface RushResult {
  /** How many orders the tills sent in all (each acknowledged in the end). */
  total: number;
  retries: number;
  acks: Ack[];
  sent: string[];
  problems: string[];
  bars: BarSocket[];
  log: string;
}

/** Checks the rush against the database, read as another process would see it. */
export async function checkRush(db: Knex, run: RushResult) {
  const { acks, sent, total } = run;
  expect(run.problems, run.log).toEqual([]);
  expect(acks.length).toBe(total);
  expect(run.retries, 'the fault happened while the counters were sending').toBeGreaterThan(0);
  expect(new Set(sent).size).toBe(total);

  const { location_id: locationId } = await db('users').where({ username: 'cashier' }).first('location_id');
  const orders: { id: number; client_order_id: string }[] = await db('orders').where({ location_id: locationId }).select('id', 'client_order_id');
  const byClientId = new Map<string, number[]>();
  for (const o of orders) byClientId.set(o.client_order_id, [...(byClientId.get(o.client_order_id) ?? []), o.id]);

  // every acknowledged order exists exactly once, with the id the counter was told
  for (const a of acks) expect(byClientId.get(a.clientOrderId), `acknowledged ${a.clientOrderId}`).toEqual([a.orderId]);
  // one logical order (one clientOrderId, however often it was retried) is one row; nothing else got in
  expect([...byClientId.values()].filter((ids) => ids.length > 1)).toEqual([]);
  expect(new Set(orders.map((o) => o.client_order_id))).toEqual(new Set(sent));
  // each order the counter was told about was acknowledged once per logical order
  expect(new Set(acks.map((a) => a.clientOrderId)).size).toBe(acks.length);

  // nothing half-written: items, a succeeded payment and exactly one order.fired event per order
  const itemless = await db('orders as o')
    .leftJoin('order_items as i', 'i.order_id', 'o.id')
    .where('o.location_id', locationId)
    .whereNull('i.id')
    .select('o.id');
  expect(itemless).toEqual([]);
  const fired = await db('events').where({ location_id: locationId, type: 'order.fired' }).select('payload');
  const firedCount = new Map<number, number>();
  for (const { payload } of fired) {
    const id = (typeof payload === 'string' ? JSON.parse(payload) : payload).ticket.id as number;
    firedCount.set(id, (firedCount.get(id) ?? 0) + 1);
  }
  expect(orders.filter((o) => firedCount.get(o.id) !== 1).map((o) => o.id)).toEqual([]);
  const [{ n: paid }] = await db('payments as p')
    .join('orders as o', 'o.id', 'p.order_id')
    .where({ 'o.location_id': locationId, 'p.status': 'succeeded' })
    .count({ n: '*' });
  expect(Number(paid)).toBe(orders.length);

  // the café's live log is contiguous: seq 1..max, no gap a resuming screen would silently skip
  const seqs = (await db('events').where({ location_id: locationId }).orderBy('seq').select('seq')).map((r: { seq: number }) => r.seq);
  expect(seqs.length).toBeGreaterThanOrEqual(total);
  expect(seqs.filter((seq, i) => seq !== i + 1).slice(0, 5), 'first events whose seq is not its position').toEqual([]);

  // each resumed bar screen holds exactly the open tickets
  const open = (await db('orders').where({ location_id: locationId, status: 'open' }).orderBy('id').select('id')).map((r: { id: number }) => r.id);
  expect(open.length).toBeGreaterThan(0);
  for (const bar of run.bars) {
    expect(bar.problems).toEqual([]);
    expect(bar.lastSeq).toBe(seqs.at(-1));
    // the final connection's hello names the log's end, and the screen had already seen all of it
    // (the resume from lastSeq replays nothing missing), so its board is final
    expect(bar.hellos.at(-1)).toBe(seqs.at(-1));
    expect([...bar.open.keys()].sort((a, b) => a - b)).toEqual(open);
  }
}

/** The last seq of the demo café's live log. */
export async function lastSeq(db: Knex): Promise<number> {
  const { location_id: locationId } = await db('users').where({ username: 'cashier' }).first('location_id');
  const row = await db('events').where({ location_id: locationId }).max({ m: 'seq' }).first();
  return Number(row?.m ?? 0);
}
