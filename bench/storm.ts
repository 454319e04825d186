// One sign-in storms the live socket with resumes, the way a faulty or hostile screen could: many
// sockets, each asking to resume from 0 (a board snapshot, or the longest replay) as fast as the
// message limit lets it, reconnecting at once whenever the server closes it. Meanwhile `/healthz`
// is fetched one request at a time on another connection; its latency before and during the
// storm says whether one screen can slow everyone else down.
import { Agent, request } from 'node:http';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import WebSocket from 'ws';
import type { ServerChild } from './child';
import type { ProbeReading } from './probe';
import { summarize, type Summary } from './stats';

export interface StormResult {
  sockets: number;
  seconds: number;
  /** Resume messages sent, and the answers (a snapshot, or a replay's first event) received. */
  sent: number;
  answered: number;
  /** `rate_limited` errors received. */
  refused: number;
  /** Sockets the server closed, by close code (or refused at the upgrade, by status), and how often the storm reconnected. */
  closes: Record<string, number>;
  reconnects: number;
  /** GET /healthz, one at a time: before the storm, and during it. */
  rest: Summary;
  during: Summary;
  /** Resumes of one well-behaved screen (another sign-in) during the storm: sent → answered (ms). */
  bystander: Summary;
  /** Upgrades of the bystander's sign-in refused (429) once its resume bucket was empty. */
  bystanderRefused: number;
  /** The server's event-loop delay during the storm, and this process's own (p99, ms): the storm's
   * clients run here too, so when the latter is high the times above include their lag. */
  serverLoop: ProbeReading['loop'];
  clientLoopP99: number;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function get(url: string, agent: Agent): Promise<number> {
  return new Promise((resolve, reject) => {
    const t0 = performance.now();
    request(url, { agent }, (res) => {
      res.resume();
      res.on('end', () => resolve(performance.now() - t0));
    })
      .on('error', reject)
      .end();
  });
}

/** `/healthz` one request at a time until `until` (performance.now()). */
async function timeHealth(url: string, until: number): Promise<number[]> {
  const agent = new Agent({ keepAlive: true, maxSockets: 1 });
  const times: number[] = [];
  while (performance.now() < until) {
    times.push(await get(`${url}/healthz`, agent));
    await sleep(20);
  }
  agent.destroy();
  return times;
}

/** A frame's type without parsing it: a snapshot of a big board is hundreds of KB. */
const typeOf = (data: Buffer) => /^\{"type":"(\w+)"/.exec(data.toString('utf8', 0, 24))?.[1];

function openSocket(url: string, cookie: string): WebSocket {
  return new WebSocket(`${url.replace(/^http/, 'ws')}/ws`, { headers: { Cookie: cookie } });
}

/**
 * A screen of another sign-in resuming from 0 over and over, politely: one at a time, a pause
 * between. It resumes faster than its sign-in's bucket refills (SESSION_RESUMES in
 * server/realtime/socket-server.ts), so once the burst is spent some upgrades are refused with
 * 429; like a real screen it then waits a second and tries again, and the refusals are counted.
 */
async function bystander(url: string, cookie: string, until: number): Promise<{ times: number[]; refused: number }> {
  const times: number[] = [];
  let refused = 0;
  while (performance.now() < until) {
    const socket = openSocket(url, cookie);
    const took = await new Promise<number | null>((resolve, reject) => {
      let t0 = 0;
      socket.on('error', reject);
      socket.on('unexpected-response', (_req, res) => {
        res.resume();
        if (res.statusCode === 429) resolve(null);
        else reject(new Error(`the bystander's upgrade answered ${res.statusCode}`));
      });
      socket.on('message', (data: Buffer) => {
        const type = typeOf(data);
        if (type === 'hello') {
          t0 = performance.now();
          socket.send(JSON.stringify({ type: 'resume', since: 0, screen: 'bar' }));
        } else if (type === 'snapshot' || type === 'event') resolve(performance.now() - t0);
      });
    });
    if (took === null) {
      refused++;
      await sleep(1000);
      continue;
    }
    times.push(took);
    await new Promise<void>((r) => (socket.once('close', () => r()), socket.close()));
    await sleep(250);
  }
  return { times, refused };
}

export async function resumeStorm(
  server: ServerChild,
  stormCookie: string,
  bystanderCookie: string,
  opts = { sockets: 20, seconds: 8, perSecond: 20 },
): Promise<StormResult> {
  const url = server.url;
  const rest = await timeHealth(url, performance.now() + 3_000);
  await server.probe({ reset: true });
  const own = monitorEventLoopDelay({ resolution: 10 });
  own.enable();
  const r = { sent: 0, answered: 0, refused: 0, reconnects: 0, closes: {} as Record<string, number> };
  const until = performance.now() + opts.seconds * 1000;
  const live = new Set<WebSocket>();

  const storm = (first: boolean) => {
    if (performance.now() >= until) return;
    if (!first) r.reconnects++;
    const socket = openSocket(url, stormCookie);
    live.add(socket);
    let timer: ReturnType<typeof setInterval> | undefined;
    let refused = false;
    socket.on('error', () => {});
    socket.on('unexpected-response', (_req, res) => {
      refused = true;
      r.closes[`${res.statusCode} at the upgrade`] = (r.closes[`${res.statusCode} at the upgrade`] ?? 0) + 1;
      res.resume();
      socket.terminate();
    });
    socket.on('message', (data: Buffer) => {
      const type = typeOf(data);
      if (type === 'hello') {
        // as fast as the server's message limit (RATE_PER_SECOND) allows
        timer = setInterval(() => {
          if (socket.readyState !== WebSocket.OPEN || performance.now() >= until) return clearInterval(timer);
          socket.send('{"type":"resume","since":0}');
          r.sent++;
        }, 1000 / opts.perSecond);
      } else if (type === 'snapshot') r.answered++;
      else if (type === 'error' && data.includes('rate_limited')) r.refused++;
    });
    socket.on('close', (code) => {
      clearInterval(timer);
      live.delete(socket);
      if (performance.now() < until) {
        if (!refused) r.closes[code] = (r.closes[code] ?? 0) + 1;
        storm(false);
      }
    });
  };
  for (let i = 0; i < opts.sockets; i++) storm(true);
  const [during, polite] = await Promise.all([timeHealth(url, until), bystander(url, bystanderCookie, until)]);
  const { loop: serverLoop } = await server.probe();
  own.disable();
  await Promise.all([...live].map((s) => new Promise<void>((res) => (s.once('close', () => res()), s.terminate()))));
  await sleep(1_000); // let the server finish what the storm left it
  return {
    sockets: opts.sockets,
    seconds: opts.seconds,
    ...r,
    rest: summarize(rest),
    during: summarize(during),
    bystander: summarize(polite.times),
    bystanderRefused: polite.refused,
    serverLoop,
    clientLoopP99: own.percentile(99) / 1e6,
  };
}
