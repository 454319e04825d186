// npm run bench:group [-- --processes 1,2,3 --sockets 100 --counters 10 --rate 20 --seconds 10 --no-write]
// A café group's set-up on one machine: a throwaway PostgreSQL and Redis, N Jugline processes (the
// production build) and nginx in front with deploy/nginx.conf, for each N asked for. Through nginx:
// order → every screen's socket at a steady rate (the screens spread over the processes by nginx,
// so most events cross Redis), then the closed loop's throughput. CPU per order is the sum over all
// processes. Prints one table and writes it into BENCHMARKS.md (block `group`), beside the
// single-process SQLite figures of the last `npm run bench`.
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { MAX_SOCKETS_PER_SESSION } from '@server/realtime/socket-server';
import { startNginx, type Nginx } from '@scripts/services/nginx';
import { startRedis, type RedisServer } from '@scripts/services/redis';
import { freePort } from '@scripts/services/free-port';
import { between, putBetween, RESULTS } from './blocks';
import { orderBodies } from './bodies';
import { ROOT, startChild, type ServerChild } from './child';
import { benchDatabases, type BenchDatabases } from './databases';
import { closedLoop, closeHarness, connectMeasured, harness, openLoop, signIn } from './load';
import type { ProbeReading } from './probe';
import type { BenchResults } from './report';

const USAGE = 'Usage: npm run bench:group -- [--processes 1,2,3] [--sockets 100] [--counters 10] [--rate 20] [--seconds 10] [--out BENCHMARKS.md] [--no-write]';

function options() {
  const { values } = parseArgs({
    options: {
      processes: { type: 'string', default: '1,2,3' },
      sockets: { type: 'string', default: '100' },
      counters: { type: 'string', default: '10' },
      rate: { type: 'string', default: '20' },
      seconds: { type: 'string', default: '10' },
      out: { type: 'string', default: 'BENCHMARKS.md' },
      'no-write': { type: 'boolean', default: false },
      help: { type: 'boolean', short: 'h' },
    },
    strict: true,
  });
  if (values.help) {
    console.log(USAGE);
    process.exit(0);
  }
  const whole = (v: string, min: number, max: number) => {
    const n = Number(v);
    if (!Number.isInteger(n) || n < min || n > max) {
      console.error(`"${v}" is not a whole number from ${min} to ${max}\n${USAGE}`);
      process.exit(2);
    }
    return n;
  };
  return {
    processes: values.processes.split(',').map((p) => whole(p, 1, 8)),
    sockets: whole(values.sockets, 1, 1000),
    counters: whole(values.counters, 1, 50),
    rate: whole(values.rate, 1, 200),
    seconds: whole(values.seconds, 3, 600),
    out: path.resolve(ROOT, values.out),
    write: !values['no-write'],
  };
}

/** The processes behind nginx, read as one server: CPU and memory summed, the worst event loop. */
function asOne(children: ServerChild[], url: string): ServerChild {
  return {
    url,
    probe: async (opts) => {
      const readings = await Promise.all(children.map((c) => c.probe(opts)));
      const sum = (k: 'cpuMs' | 'rss' | 'heapUsed' | 'external') => readings.reduce((n, r) => n + r[k], 0);
      const worst = readings.reduce((a, b) => (b.loop.p99 > a.loop.p99 ? b : a));
      return { loop: worst.loop, cpuMs: sum('cpuMs'), rss: sum('rss'), heapUsed: sum('heapUsed'), external: sum('external') } satisfies ProbeReading;
    },
    stop: async () => {
      for (const c of children) await c.stop();
    },
  };
}

interface GroupRow {
  processes: number;
  allSocketsP50: number;
  allSocketsP99: number;
  ackP99: number;
  incomplete: number;
  throughput: number;
  cpuPerOrder: number;
}

async function measure(n: number, o: ReturnType<typeof options>, dbs: BenchDatabases, redis: RedisServer): Promise<GroupRow> {
  const target = await dbs.create(`group${n}`);
  const env = { ...dbs.envOf(target), BENCH_REDIS_URL: redis.url, BENCH_SESSION_SECRET: randomBytes(32).toString('hex') };
  const children: ServerChild[] = [];
  let nginx: Nginx | undefined;
  try {
    // one at a time: the first migrates and loads the demo café, the rest find it done
    for (let i = 0; i < n; i++) children.push(await startChild('jugline-server.ts', { ...env, BENCH_PORT: String(await freePort()) }));
    nginx = await startNginx(children.map((c) => Number(new URL(c.url).port)));
    const group = asOne(children, nginx.url);
    const counters: string[] = [];
    for (let i = 0; i < o.counters; i++) counters.push(await signIn(nginx.url, 'cashier'));
    const sessions = Math.max(Math.min(100, o.sockets), Math.ceil(o.sockets / MAX_SOCKETS_PER_SESSION));
    const screens: string[] = [];
    for (let i = 0; i < sessions; i++) screens.push(await signIn(nginx.url, i % 2 ? 'barista2' : 'barista'));
    const bodies = orderBodies(await (await fetch(`${nginx.url}/api/menu`, { headers: { cookie: counters[0] } })).json());
    const h = harness(group, counters);
    const run = { counters: o.counters, rate: o.rate, seconds: o.seconds, bodies, tag: `G${n}-` };
    await connectMeasured(h, o.sockets, (i) => screens[i % sessions]);
    await openLoop(h, { ...run, seconds: 2 }, false); // warm-up
    const main = await openLoop(h, run, true);
    const loop = await closedLoop(h, run, 5);
    await closeHarness(h);
    const row = {
      processes: n,
      allSocketsP50: main.allSockets.p50,
      allSocketsP99: main.allSockets.p99,
      ackP99: main.ack.p99,
      incomplete: main.incomplete,
      throughput: loop.throughput,
      cpuPerOrder: loop.cpuPerOrder,
    };
    console.log(
      `  ${n} process${n === 1 ? '' : 'es'}: order → all ${o.sockets} sockets p99 ${row.allSocketsP99.toFixed(1)} ms; closed loop ${row.throughput.toFixed(0)} orders/s, ${row.cpuPerOrder.toFixed(1)} ms CPU per order`,
    );
    return row;
  } finally {
    await nginx?.stop();
    for (const c of children) await c.stop();
  }
}

function table(rows: GroupRow[], o: ReturnType<typeof options>, single: BenchResults | undefined, load: [number, number]): string {
  const f = (n: number) => n.toFixed(1);
  const lines = [
    `A group on one machine (${os.cpus().length} cores, ${os.cpus()[0]?.model?.trim() ?? 'unknown'}; load ${load[0].toFixed(1)} at the start, ${load[1].toFixed(1)} at the end; ${new Date().toISOString().slice(0, 10)}): PostgreSQL, Redis and nginx on the same cores as the processes. ${o.sockets} screens through nginx, ${o.rate} orders/s for ${o.seconds} s, then ${o.counters} counters in a closed loop for 5 s.`,
    '',
    '| processes behind nginx | order → all sockets p50 (ms) | p99 (ms) | order answered p99 (ms) | closed loop (orders/s) | CPU per order, all processes (ms) |',
    '| --- | --- | --- | --- | --- | --- |',
  ];
  if (single) {
    const j = single.jugline;
    lines.push(
      `| one process on SQLite, no Redis or nginx (\`npm run bench\`, ${single.machine.date}) | ${f(j.main.allSockets.p50)} | ${f(j.main.allSockets.p99)} | ${f(j.main.ack.p99)} | ${j.saturation.throughput.toFixed(0)} | ${f(j.saturation.cpuPerOrder)} |`,
    );
  }
  for (const r of rows) {
    lines.push(
      `| ${r.processes} on PostgreSQL + Redis${r.incomplete ? ` (${r.incomplete} orders missed a socket)` : ''} | ${f(r.allSocketsP50)} | ${f(r.allSocketsP99)} | ${f(r.ackP99)} | ${r.throughput.toFixed(0)} | ${f(r.cpuPerOrder)} |`,
    );
  }
  return lines.join('\n');
}

async function main() {
  const o = options();
  const loadAtStart = os.loadavg()[0];
  if (!existsSync(path.join(ROOT, 'dist/client/index.html'))) throw new Error('No build in dist/: run `npm run build` first.');
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'jugline-bench-group-'));
  let dbs: BenchDatabases | undefined;
  let redis: RedisServer | undefined;
  try {
    dbs = await benchDatabases('postgres', tmp);
    redis = await startRedis();
    const rows: GroupRow[] = [];
    for (const n of o.processes) {
      console.log(`${n} Jugline process${n === 1 ? '' : 'es'} behind nginx…`);
      rows.push(await measure(n, o, dbs, redis));
    }
    const text = existsSync(o.out) ? readFileSync(o.out, 'utf8') : '# Benchmarks\n';
    const single = between(text, 'sqlite')?.match(RESULTS)?.[1];
    const out = table(rows, o, single ? (JSON.parse(single) as BenchResults) : undefined, [loadAtStart, os.loadavg()[0]]);
    console.log('\n' + out);
    if (o.write) {
      writeFileSync(o.out, putBetween(text, 'group', out));
      console.log(`Written to ${path.relative(ROOT, o.out)}`);
    }
  } finally {
    await redis?.stop();
    await dbs?.stop();
    rmSync(tmp, { recursive: true, force: true });
  }
}

main().then(
  () => process.exit(0),
  (err) => {
    console.error(err);
    process.exit(1);
  },
);
