// The load: screens on live sockets and counters sending orders, against one server (Jugline or
// the floor — the same client code for both, so their figures compare). All times are taken in
// this process with performance.now(); an order's clock starts at its scheduled send time (open
// loop), so a server that falls behind shows as latency rather than as fewer orders sent.
import { randomUUID } from 'node:crypto';
import { Agent, request } from 'node:http';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import WebSocket from 'ws';
import type { ProbeReading } from './probe';
import type { ServerChild } from './child';
import { Samples, summarize, type Summary } from './stats';

export interface OrderBody {
  items: { menuItemId: number; sizeId?: number; milkId?: number }[];
  /** Bar drinks in it (the screens' count of open drinks). */
  barDrinks: number;
}

export interface Session {
  cookie?: string;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export async function signIn(url: string, username: string): Promise<string> {
  const res = await fetch(`${url}/api/session`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ username, password: 'jugline-demo' }),
  });
  if (res.status !== 200) throw new Error(`sign-in as ${username}: ${res.status}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}

// ---- the counters --------------------------------------------------------------------------

interface Counter {
  agent: Agent;
  cookie?: string;
}

/** POST one order; resolves with the answer's status, body and Retry-After when it has fully arrived. */
export function postOrder(url: string, counter: Counter, body: object): Promise<{ status: number; text: string; retryAfter?: string }> {
  const data = JSON.stringify(body);
  const u = new URL('/api/orders', url);
  return new Promise((resolve, reject) => {
    const req = request(
      {
        host: u.hostname,
        port: u.port,
        path: u.pathname,
        method: 'POST',
        agent: counter.agent,
        headers: {
          'content-type': 'application/json',
          'content-length': Buffer.byteLength(data),
          ...(counter.cookie ? { cookie: counter.cookie } : {}),
        },
      },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, text: Buffer.concat(chunks).toString(), retryAfter: res.headers['retry-after'] }));
        res.on('error', reject);
      },
    );
    req.on('error', reject);
    req.end(data);
  });
}

/** GET /healthz through an agent (opens, or reuses, one of its connections). */
function healthz(url: string, agent: Agent): Promise<void> {
  const u = new URL('/healthz', url);
  return new Promise((resolve, reject) => {
    const req = request({ host: u.hostname, port: u.port, path: u.pathname, agent }, (res) => {
      res.resume();
      res.on('end', resolve);
    });
    req.on('error', reject);
    req.end();
  });
}

// ---- the screens ---------------------------------------------------------------------------

interface Pending {
  sentAt: number;
  arrivals: number;
  last: number;
  acked: number;
}

/** Where an order's event has to reach: every open socket. Matches events by the ticket's name. */
class Screens {
  readonly sockets: WebSocket[] = [];
  readonly pending = new Map<string, Pending>();
  /** Time from an order's send to its event at one socket, every (order, socket) pair. */
  oneSocket = new Samples();
  measuring = false;

  connect(url: string, cookie: string | undefined, screen: 'bar' | 'pickup'): Promise<void> {
    const socket = new WebSocket(`${url.replace(/^http/, 'ws')}/ws`, cookie ? { headers: { Cookie: cookie } } : {});
    this.sockets.push(socket);
    return new Promise((resolve, reject) => {
      socket.once('error', reject);
      socket.on('message', (data: Buffer) => {
        const now = performance.now();
        const text = data.toString();
        if (text.startsWith('{"type":"hello"')) {
          const seq = Number(/"seq":(\d+)/.exec(text)?.[1] ?? 0);
          socket.send(JSON.stringify({ type: 'resume', since: seq, screen }));
          resolve();
          return;
        }
        // a Pickup socket's tickets carry the first name (the bench's names are one word)
        const key = text.includes('"customerName":"') ? '"customerName":"' : '"firstName":"';
        const at = text.indexOf(key);
        if (at < 0) return;
        const name = text.slice(at + key.length, text.indexOf('"', at + key.length));
        const p = this.pending.get(name);
        if (!p) return;
        p.arrivals++;
        p.last = now;
        if (this.measuring) this.oneSocket.push(now - p.sentAt);
      });
    });
  }

  async connectMany(url: string, count: number, cookieFor: (i: number) => string | undefined) {
    const start = this.sockets.length;
    for (let i = start; i < start + count; i += 50) {
      await Promise.all(
        Array.from({ length: Math.min(50, start + count - i) }, (_, k) => this.connect(url, cookieFor(i + k), (i + k) % 4 === 3 ? 'pickup' : 'bar')),
      );
    }
    await sleep(500); // the last resumes are read before the first order goes
  }

  async closeFrom(index: number) {
    const gone = this.sockets.splice(index);
    await Promise.all(gone.map((s) => new Promise<void>((r) => (s.once('close', () => r()), s.close()))));
  }
}

// ---- a run ---------------------------------------------------------------------------------

export interface RunOptions {
  counters: number;
  rate: number;
  seconds: number;
  bodies: OrderBody[];
  /** A name prefix unique to the run, so events are matched to their orders. */
  tag: string;
}

export interface RunResult {
  sockets: number;
  orders: number;
  /** POST sent → answer received. */
  ack: Summary;
  /** POST sent → the event at one socket (every order × socket pair). */
  oneSocket: Summary;
  /** POST sent → the event at the last of all sockets. */
  allSockets: Summary;
  /** Orders whose event did not reach every socket within the drain time. */
  incomplete: number;
  /** Acknowledged orders per second over the run. */
  throughput: number;
  loop: ProbeReading['loop'];
  /** Server CPU time per order over the run (ms). */
  cpuPerOrder: number;
  /** This process's own event-loop delay p99 (ms): when high, the times include the load generator's lag. */
  clientLoopP99: number;
  failures: number;
  /** The first few failures, for the console. */
  failed: string[];
}

export interface Harness {
  screens: Screens;
  counters: Counter[];
  url: string;
  server: ServerChild;
  /** Answers kept per body, for the floor's templates. */
  answers: Map<number, { clientOrderId: string; text: string }>;
  seq: number;
}

export function harness(server: ServerChild, counterCookies: (string | undefined)[]): Harness {
  return {
    screens: new Screens(),
    counters: counterCookies.map((cookie) => ({ cookie, agent: new Agent({ keepAlive: true, maxSockets: 6 }) })),
    url: server.url,
    server,
    answers: new Map(),
    seq: 0,
  };
}

function orderBody(h: Harness, opts: RunOptions, k: number) {
  const variant = k % opts.bodies.length;
  const name = `${opts.tag}${++h.seq}`;
  return {
    variant,
    name,
    body: {
      clientOrderId: randomUUID(),
      customerName: name,
      items: opts.bodies[variant].items,
      payment: { method: 'cash', tenderedCents: 10_000 },
    },
  };
}

async function drain(h: Harness, names: string[], acks: Promise<unknown>[], timeoutMs = 10_000) {
  await Promise.allSettled(acks);
  const want = h.screens.sockets.length;
  const until = performance.now() + timeoutMs;
  while (performance.now() < until && names.some((n) => (h.screens.pending.get(n)?.arrivals ?? 0) < want)) await sleep(20);
}

/** Open loop: order k goes at start + k/rate from counter k mod C, whatever the earlier ones did. */
export async function openLoop(h: Harness, opts: RunOptions, measure: boolean): Promise<RunResult> {
  const total = Math.round(opts.rate * opts.seconds);
  const ackTimes = new Samples();
  const names: string[] = [];
  const acks: Promise<unknown>[] = [];
  let failures = 0;
  const failed: string[] = [];
  const fail = (what: string) => {
    failures++;
    if (failed.length < 3) failed.push(what.slice(0, 200));
  };
  h.screens.oneSocket = new Samples();
  h.screens.measuring = measure;
  const first = await h.server.probe({ reset: measure });
  const own = monitorEventLoopDelay({ resolution: 10 });
  own.enable();
  const start = performance.now() + 20;
  for (let k = 0; k < total; k++) {
    const due = start + (k * 1000) / opts.rate;
    const wait = due - performance.now();
    if (wait > 1) await sleep(wait);
    const { variant, name, body } = orderBody(h, opts, k);
    const p: Pending = { sentAt: due, arrivals: 0, last: 0, acked: 0 };
    h.screens.pending.set(name, p);
    names.push(name);
    acks.push(
      postOrder(h.url, h.counters[k % h.counters.length], body).then(
        ({ status, text }) => {
          p.acked = performance.now();
          if (status !== 201) fail(`${status} ${text}`);
          else {
            ackTimes.push(p.acked - due);
            if (!h.answers.has(variant)) h.answers.set(variant, { clientOrderId: body.clientOrderId, text });
          }
        },
        (err: Error) => fail(err.message),
      ),
    );
  }
  await drain(h, names, acks);
  const end = Math.max(...names.map((n) => h.screens.pending.get(n)!.acked));
  const last = await h.server.probe();
  const loop = last.loop;
  own.disable();
  h.screens.measuring = false;
  const want = h.screens.sockets.length;
  const complete = names.map((n) => h.screens.pending.get(n)!).filter((p) => p.arrivals >= want);
  const result: RunResult = {
    sockets: want,
    orders: total,
    ack: summarize(ackTimes.values()),
    oneSocket: summarize(h.screens.oneSocket.values()),
    allSockets: summarize(complete.map((p) => p.last - p.sentAt)),
    incomplete: total - complete.length,
    throughput: ackTimes.length / ((end - start) / 1000),
    loop,
    cpuPerOrder: (last.cpuMs - first.cpuMs) / total,
    clientLoopP99: own.percentile(99) / 1e6,
    failures,
    failed,
  };
  if (failed.length) console.log(`  failed POSTs: ${failed.join(' | ')}`);
  for (const n of names) h.screens.pending.delete(n);
  return result;
}

/** Closed loop: every counter sends its next order as soon as the last is answered. */
export async function closedLoop(
  h: Harness,
  opts: RunOptions,
  seconds: number,
): Promise<{ throughput: number; delivered: number; loop: ProbeReading['loop']; cpuPerOrder: number }> {
  const first = await h.server.probe({ reset: true });
  const names: string[] = [];
  let done = 0;
  let k = 0;
  const start = performance.now();
  const until = start + seconds * 1000;
  await Promise.all(
    h.counters.map(async (counter) => {
      while (performance.now() < until) {
        const { name, body } = orderBody(h, opts, k++);
        h.screens.pending.set(name, { sentAt: performance.now(), arrivals: 0, last: 0, acked: 0 });
        names.push(name);
        const { status } = await postOrder(h.url, counter, body);
        if (status === 201) done++;
      }
    }),
  );
  const elapsed = (performance.now() - start) / 1000;
  const last = await h.server.probe();
  await drain(h, names, []);
  const want = h.screens.sockets.length;
  const delivered = names.filter((n) => h.screens.pending.get(n)!.arrivals >= want).length;
  for (const n of names) h.screens.pending.delete(n);
  return {
    throughput: done / elapsed,
    delivered: delivered / Math.max(1, names.length),
    loop: last.loop,
    cpuPerOrder: (last.cpuMs - first.cpuMs) / Math.max(1, done),
  };
}

export interface OverloadResult {
  rate: number;
  seconds: number;
  sent: number;
  /** Answered 201 the first time: their POST → answer times. */
  accepted: Summary;
  /** Answered 503: their POST → answer times, and how many carried Retry-After. */
  refused: Summary;
  refusedWithRetryAfter: number;
  /** Any other answer, or no answer (a refused or reset connection). */
  errors: number;
  firstErrors: string[];
  /** The refused orders sent again after Retry-After with the same clientOrderId, as the Counter's queue does. */
  resent: { rounds: number; placed: number; refusedAgain: number; alreadyThere: number; left: number };
  /** Distinct orders the server answered, against distinct orders sent: equal when each was placed once. */
  distinctOrders: number;
  rssBefore: number;
  rssAfter: number;
  loop: ProbeReading['loop'];
  /** This process's own event-loop delay p99, and how late it sent an order at worst (ms): when high, the times include the load generator's lag. */
  clientLoopP99: number;
  latestSend: number;
}

/**
 * Overload: an open loop at `rate` (twice what the closed loop reached) for `seconds`, each counter
 * free to open as many connections as it needs, so the server, not the load generator, decides what
 * waits. Then the refused orders go again after their Retry-After, as the Counter's queue sends
 * them, until each is placed.
 */
export async function overload(h: Harness, opts: RunOptions): Promise<OverloadResult> {
  const counters = h.counters.map((c) => ({ cookie: c.cookie, agent: new Agent({ keepAlive: true, maxSockets: 64 }) }));
  // Connections opened beforehand, as a room of tablets (or nginx's upstream keep-alive) holds
  // them: hundreds of new connections in the first second would overflow the listen queue, and
  // the kernel's SYN retries (1 s, 3 s, 7 s) would be measured instead of the server.
  await Promise.all(counters.flatMap((c) => Array.from({ length: 32 }, () => healthz(h.url, c.agent))));
  const before = await h.server.probe({ gc: true, reset: true });
  const total = Math.round(opts.rate * opts.seconds);
  const accepted = new Samples();
  const refusedTimes = new Samples();
  const refused: { body: object; retryAfter: number }[] = [];
  const ids = new Set<number>();
  let withRetryAfter = 0;
  let errors = 0;
  const firstErrors: string[] = [];
  const error = (what: string) => {
    errors++;
    if (firstErrors.length < 3) firstErrors.push(what.slice(0, 200));
  };
  const sends: Promise<void>[] = [];
  const own = monitorEventLoopDelay({ resolution: 10 });
  own.enable();
  let latestSend = 0;
  const start = performance.now() + 20;
  for (let k = 0; k < total; k++) {
    const due = start + (k * 1000) / opts.rate;
    const wait = due - performance.now();
    if (wait > 1) await sleep(wait);
    latestSend = Math.max(latestSend, performance.now() - due);
    const { body } = orderBody(h, opts, k);
    sends.push(
      postOrder(h.url, counters[k % counters.length], body).then(
        ({ status, text, retryAfter }) => {
          const took = performance.now() - due;
          if (status === 201) {
            accepted.push(took);
            ids.add((JSON.parse(text) as { order: { id: number } }).order.id);
          } else if (status === 503) {
            refusedTimes.push(took);
            if (retryAfter) withRetryAfter++;
            refused.push({ body, retryAfter: Number(retryAfter ?? 1) });
          } else error(`${status} ${text}`);
        },
        (err: Error) => error(err.message),
      ),
    );
  }
  await Promise.all(sends);
  own.disable();
  const during = await h.server.probe();
  // the Counter's queue: wait what the server said, send again (same clientOrderId), until placed
  const resent = { rounds: 0, placed: 0, refusedAgain: 0, alreadyThere: 0, left: refused.length };
  let waiting = refused;
  while (waiting.length && resent.rounds < 20) {
    resent.rounds++;
    await sleep(Math.max(...waiting.map((w) => w.retryAfter)) * 1000);
    const next: typeof waiting = [];
    // a room of counters, one order at a time each
    await Promise.all(
      counters.map(async (counter, c) => {
        for (let i = c; i < waiting.length; i += counters.length) {
          const { status, text, retryAfter } = await postOrder(h.url, counter, waiting[i].body).catch((err: Error) => ({
            status: 0,
            text: err.message,
            retryAfter: undefined,
          }));
          if (status === 201 || status === 200) {
            if (status === 201) resent.placed++;
            else resent.alreadyThere++; // a refused order the server had kept after all
            ids.add((JSON.parse(text) as { order: { id: number } }).order.id);
          } else if (status === 503) {
            resent.refusedAgain++;
            next.push({ body: waiting[i].body, retryAfter: Number(retryAfter ?? 1) });
          } else error(`resend: ${status} ${text}`);
        }
      }),
    );
    waiting = next;
  }
  resent.left = waiting.length;
  const after = await h.server.probe({ gc: true });
  for (const c of counters) c.agent.destroy();
  return {
    rate: opts.rate,
    seconds: opts.seconds,
    sent: total,
    accepted: summarize(accepted.values()),
    refused: summarize(refusedTimes.values()),
    refusedWithRetryAfter: withRetryAfter,
    errors,
    firstErrors,
    resent,
    distinctOrders: ids.size,
    rssBefore: before.rss,
    rssAfter: after.rss,
    loop: during.loop,
    clientLoopP99: own.percentile(99) / 1e6,
    latestSend,
  };
}

export interface MemoryReading {
  before: ProbeReading;
  after: ProbeReading;
  sockets: number;
}

/** Connect `count` more sockets and read the server's memory (after a collection) on both sides. */
export async function connectMeasured(h: Harness, count: number, cookieFor: (i: number) => string | undefined): Promise<MemoryReading> {
  const before = await h.server.probe({ gc: true });
  await h.screens.connectMany(h.url, count, cookieFor);
  await sleep(300);
  const after = await h.server.probe({ gc: true });
  return { before, after, sockets: count };
}

export async function closeHarness(h: Harness) {
  await h.screens.closeFrom(0);
  for (const c of h.counters) c.agent.destroy();
}
