// npm run bench [-- --db sqlite|postgres --sockets 100 --counters 10 --rate 20 --seconds 20 --big 1000
//                  --dist dist --days 365 --port 4326 --out BENCHMARKS.md --no-write --profile <dir> --storm-only]
// One run, on fresh databases (SQLite files in a temp folder, or with --db postgres databases in a
// throwaway PostgreSQL cluster), against the production build (built first when the folder has none).
// The floor always runs on SQLite: it is the fixed yardstick both runs are read against.
//   1. order → screens: Jugline, then the floor (the same libraries bare), under the same load; a
//      closed loop for the most each takes; on Jugline, twice that as an open loop (overload);
//   2. a bigger socket count on both (--big; 0 leaves it out);
//   3. /bar server-rendered with 20, 100 and 300 open drinks, Pulse and the reports over a year;
//   4. one sign-in storming the live socket with resumes while /healthz is timed (bench/storm.ts);
//   5. `npm start` → /readyz, first start and restarts (bench/startup.ts);
//   6. client weight per screen from the build manifest.
// Both servers run compiled ahead of time on plain Node, as `npm start` runs Jugline (bench/child.ts).
// --storm-only runs step 4 alone on a fresh server (about 30 s) and writes nothing.
// Prints one table and writes it into BENCHMARKS.md between its markers.
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import type { Knex } from 'knex';
import { generateHistory } from '@scripts/history/generate';
import { MAX_REPLAY, MAX_SOCKETS_PER_SESSION } from '@server/realtime/socket-server';
import { rawRows } from '@server/db/dialect';
import { createDb } from '@server/db/knex';
import { prepareDatabase } from '@server/server';
import { ROOT, startChild, type ServerChild } from './child';
import { benchDatabases, type BenchDatabases, type BenchDb } from './databases';
import type { OrderTemplate } from './floor-server';
import {
  closedLoop,
  closeHarness,
  connectMeasured,
  harness,
  openLoop,
  overload,
  signIn,
  type Harness,
  type MemoryReading,
  type OrderBody,
  type OverloadResult,
  type RunResult,
} from './load';
import { startupTimes } from './startup';
import { buildServer } from '@scripts/build-server';
import { fillOpenDrinks, historyEndpoints, renderBar, type Timed } from './pages';
import { between, putBetween, RESULTS } from './blocks';
import { orderBodies, type MenuItem } from './bodies';
import { report, sideBySide, stormTable, type BenchResults } from './report';
import { resumeStorm, type StormResult } from './storm';
import { screenWeights } from './weights';

const USAGE =
  'Usage: npm run bench -- [--db sqlite|postgres] [--sockets 100] [--counters 10] [--rate 20] [--seconds 20] [--big 1000] [--dist dist] [--days 365] [--port 4326] [--out BENCHMARKS.md] [--no-write] [--profile <dir>] [--storm-only]';

function parsed() {
  try {
    return parseArgs({
      options: {
        db: { type: 'string', default: 'sqlite' },
        sockets: { type: 'string', default: '100' },
        counters: { type: 'string', default: '10' },
        rate: { type: 'string', default: '20' },
        seconds: { type: 'string', default: '20' },
        big: { type: 'string', default: '1000' },
        dist: { type: 'string', default: process.env.JUGLINE_DIST ?? 'dist' },
        days: { type: 'string', default: '365' },
        port: { type: 'string', default: '4326' },
        out: { type: 'string', default: 'BENCHMARKS.md' },
        'no-write': { type: 'boolean', default: false },
        profile: { type: 'string' },
        'storm-only': { type: 'boolean', default: false },
        help: { type: 'boolean', short: 'h', default: false },
      },
      strict: true,
    });
  } catch (err) {
    console.error(`${(err as Error).message}\n${USAGE}`);
    process.exit(2);
  }
}

function options() {
  const { values } = parsed();
  if (values.help) {
    console.log(USAGE);
    process.exit(0);
  }
  const int = (name: keyof typeof values, min: number, max: number) => {
    const n = Number(values[name]);
    if (!Number.isInteger(n) || n < min || n > max) {
      console.error(`--${name} takes a whole number from ${min} to ${max}, not "${values[name]}"\n${USAGE}`);
      process.exit(2);
    }
    return n;
  };
  if (values.db !== 'sqlite' && values.db !== 'postgres') {
    console.error(`--db takes sqlite or postgres, not "${values.db}"\n${USAGE}`);
    process.exit(2);
  }
  const o = {
    db: values.db as BenchDb,
    sockets: int('sockets', 1, 1000),
    counters: int('counters', 1, 50),
    rate: int('rate', 1, 200),
    seconds: int('seconds', 3, 600),
    big: int('big', 0, 1000),
    days: int('days', 0, 3660), // 0: no history (a quick run)
    port: int('port', 1024, 65530),
    dist: path.resolve(ROOT, values.dist!),
    out: path.resolve(ROOT, values.out!),
    write: !values['no-write'] && !values['storm-only'],
    stormOnly: values['storm-only']!,
  };
  if (values.profile) process.env.BENCH_PROFILE_DIR = path.resolve(values.profile);
  if (o.big !== 0 && o.big <= o.sockets) o.big = 0; // nothing bigger to try
  return o;
}

async function ensureBuild(dist: string) {
  const built = ['client/index.html', 'client/.vite/manifest.json', 'server/entry-server.js', 'app/server/index.js'].every((f) =>
    existsSync(path.join(dist, f)),
  );
  if (built) return false;
  console.log(`No complete build in ${dist} — building it…`);
  const { build } = await import('vite');
  await build({ root: ROOT, logLevel: 'warn', build: { outDir: path.join(dist, 'client'), emptyOutDir: true } });
  await build({ root: ROOT, logLevel: 'warn', build: { ssr: 'src/entry-server.tsx', outDir: path.join(dist, 'server'), emptyOutDir: true } });
  await buildServer(dist);
  return true;
}

/** A row as the floor's SQLite takes it: PostgreSQL answers booleans and json columns as values. */
function sqliteRow({ id: _id, ...row }: Record<string, unknown>) {
  return Object.fromEntries(
    Object.entries(row).map(([k, v]) => [
      k,
      typeof v === 'boolean' ? Number(v) : v instanceof Date ? v.toISOString() : v !== null && typeof v === 'object' ? JSON.stringify(v) : v,
    ]),
  );
}

/** What Jugline stored for one order of each body (on either database): the floor inserts the same rows. */
async function readTemplates(target: string, h: Harness, bodies: OrderBody[]): Promise<OrderTemplate[]> {
  const db: Knex = createDb(target);
  try {
    const fired = rawRows<{ type: string; payload: unknown }>(await db.raw("select type, payload from events where type = 'order.fired'"));
    const payloads = fired.map((e) => ({
      type: e.type,
      payload: (typeof e.payload === 'string' ? JSON.parse(e.payload) : e.payload) as OrderTemplate['event']['payload'],
    }));
    return await Promise.all(
      bodies.map(async (body, variant) => {
        const answer = h.answers.get(variant);
        if (!answer) throw new Error(`no answered order of body ${variant} to copy for the floor`);
        const order = await db('orders').where({ client_order_id: answer.clientOrderId }).first();
        const items = await db('order_items').where({ order_id: order.id }).orderBy('line_no');
        const payments = await db('payments').where({ order_id: order.id });
        const event = payloads.find((e) => Number(e.payload.ticket.id) === Number(order.id));
        if (!event) throw new Error(`no order.fired event for order ${order.id}`);
        return {
          key: JSON.stringify(body.items),
          order: sqliteRow(order),
          items: items.map(sqliteRow),
          payments: payments.map(sqliteRow),
          event,
          response: JSON.parse(answer.text),
        };
      }),
    );
  } finally {
    await db.destroy();
  }
}

export interface SideResult {
  main: RunResult;
  memory: MemoryReading;
  saturation: Awaited<ReturnType<typeof closedLoop>>;
  big?: { run: RunResult; memory: MemoryReading };
  /** Jugline only: twice the closed loop's throughput, open loop (the floor sheds nothing). */
  overload?: OverloadResult;
}

type O = ReturnType<typeof options>;

/**
 * The resume storm (bench/storm.ts) on a board of 300 open drinks, with a log longer than a
 * replay (a lead 86es an item and puts it back), so each resume from 0 asks for a snapshot.
 */
async function stormPhase(server: ServerChild, bodies: OrderBody[]): Promise<StormResult> {
  const url = server.url;
  const [cashier, lead, storming, bystander] = await Promise.all(['cashier', 'lead', 'barista2', 'barista'].map((u) => signIn(url, u)));
  await fillOpenDrinks(url, cashier, bodies, 300);
  const menu = (await (await fetch(`${url}/api/menu`, { headers: { cookie: lead } })).json()) as { items: MenuItem[] };
  const item = menu.items.find((i) => i.station === 'counter') ?? menu.items[0];
  for (let i = 0; i <= MAX_REPLAY; i++) {
    const res = await fetch(`${url}/api/menu/items/${item.id}/availability`, {
      method: 'POST',
      headers: { cookie: lead, 'content-type': 'application/json' },
      body: JSON.stringify({ available: i % 2 === 0 }),
    });
    if (res.status !== 200) throw new Error(`86 toggle answered ${res.status}`);
  }
  const result = await resumeStorm(server, storming, bystander);
  console.log(
    `  /healthz median ${result.rest.p50.toFixed(1)} ms at rest, ${result.during.p50.toFixed(1)} ms during the storm (max ${result.during.max.toFixed(1)})`,
  );
  return result;
}

/** --storm-only: the storm alone, on a fresh server. */
async function stormOnly(o: O, dbs: BenchDatabases, children: ServerChild[]) {
  const server = await startChild('jugline-server.ts', { BENCH_PORT: String(o.port), ...dbs.envOf(await dbs.create('storm')), JUGLINE_DIST: o.dist });
  children.push(server);
  const cookie = await signIn(server.url, 'cashier');
  const bodies = orderBodies(await (await fetch(`${server.url}/api/menu`, { headers: { cookie } })).json());
  console.log('Resume storm…');
  const storm = await stormPhase(server, bodies);
  console.log(`\nLoad average (1 min) now: ${os.loadavg()[0].toFixed(1)} on ${os.cpus().length} cores\n\n${stormTable(storm)}`);
}

/** The same sequence on either server: sockets, warm-up, the measured run, the big run, saturation. */
async function orderToScreens(
  server: ServerChild,
  o: O,
  bodies: OrderBody[],
  cookies: { counters: (string | undefined)[]; socket: (i: number) => string | undefined },
  tag: string,
) {
  const h = harness(server, cookies.counters);
  const run = { counters: o.counters, rate: o.rate, seconds: o.seconds, bodies, tag };
  const memory = await connectMeasured(h, o.sockets, cookies.socket);
  await openLoop(h, { ...run, seconds: 2 }, false); // warm-up: JIT, caches, the first page of the log
  const main = await openLoop(h, run, true);
  console.log(`  ${o.sockets} sockets: order → all sockets p99 ${main.allSockets.p99.toFixed(1)} ms, ack p99 ${main.ack.p99.toFixed(1)} ms`);
  let big: SideResult['big'];
  if (o.big) {
    const more = await connectMeasured(h, o.big - o.sockets, (i) => cookies.socket(i));
    await openLoop(h, { ...run, seconds: 1 }, false);
    const bigRun = await openLoop(h, { ...run, seconds: Math.max(5, Math.round(o.seconds / 2)) }, true);
    big = { run: bigRun, memory: { ...more, sockets: o.big - o.sockets } };
    console.log(`  ${o.big} sockets: order → all sockets p99 ${bigRun.allSockets.p99.toFixed(1)} ms`);
    await h.screens.closeFrom(o.sockets);
  }
  const saturation = await closedLoop(h, run, 5);
  console.log(`  closed loop, ${o.counters} counters: ${saturation.throughput.toFixed(0)} orders/s`);
  let over: OverloadResult | undefined;
  if (tag === 'Jug') {
    over = await overload(h, { ...run, rate: Math.round(2 * saturation.throughput), seconds: 6 });
    console.log(
      `  overload at ${over.rate} orders/s: ${over.accepted.n} taken (p99 ${over.accepted.p99.toFixed(0)} ms), ${over.refused.n} refused with 503, ${over.errors} errors; ` +
        `${over.resent.placed} placed later in ${over.resent.rounds} rounds`,
    );
  }
  await closeHarness(h);
  return { h, result: { main, memory, saturation, big, overload: over } satisfies SideResult };
}

async function main() {
  const o = options();
  const started = performance.now();
  const loadAtStart = os.loadavg()[0];
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'jugline-bench-'));
  const children: ServerChild[] = [];
  let dbs: BenchDatabases | undefined;
  const cleanup = async () => {
    await Promise.all(children.map((c) => c.stop()));
    await dbs?.stop();
    rmSync(tmp, { recursive: true, force: true });
  };
  try {
    const built = await ensureBuild(o.dist);
    dbs = await benchDatabases(o.db, tmp);
    if (o.stormOnly) return await stormOnly(o, dbs, children);
    const weights = screenWeights(path.join(o.dist, 'client'));

    // 1. Jugline
    console.log(
      `Jugline on ${o.db === 'postgres' ? 'PostgreSQL' : 'SQLite'}: ${o.sockets} sockets, ${o.counters} counters at ${o.rate} orders/s for ${o.seconds} s…`,
    );
    const jTarget = await dbs.create('jugline');
    const jugline = await startChild('jugline-server.ts', { BENCH_PORT: String(o.port), ...dbs.envOf(jTarget), JUGLINE_DIST: o.dist });
    children.push(jugline);
    const counterCookies: string[] = [];
    for (let i = 0; i < o.counters; i++) counterCookies.push(await signIn(jugline.url, 'cashier'));
    // one session per screen, as on real tablets (up to 100: a bcrypt sign-in costs ~0.1 s), and
    // enough that none holds more sockets than one sign-in may (MAX_SOCKETS_PER_SESSION)
    const screenCookies: string[] = [];
    const screens = Math.max(o.sockets, o.big);
    const sessions = Math.max(Math.min(100, screens), Math.ceil(screens / MAX_SOCKETS_PER_SESSION));
    for (let i = 0; i < sessions; i++) screenCookies.push(await signIn(jugline.url, i % 4 === 3 ? 'cashier' : i % 2 ? 'barista2' : 'barista'));
    const menu = await (await fetch(`${jugline.url}/api/menu`, { headers: { cookie: counterCookies[0] } })).json();
    const bodies = orderBodies(menu);
    const j = await orderToScreens(jugline, o, bodies, { counters: counterCookies, socket: (i) => screenCookies[i % sessions] }, 'Jug');
    const templates = await readTemplates(jTarget, j.h, bodies);
    await jugline.stop();
    children.pop();

    // 2. the floor, on a database migrated and seeded the same way
    console.log('Floor: the same load on node:http + better-sqlite3 + ws…');
    const fFile = path.join(tmp, 'floor.sqlite');
    await (await prepareDatabase({ databaseFile: fFile, seedDemo: true }, () => {})).destroy();
    const tFile = path.join(tmp, 'templates.json');
    writeFileSync(tFile, JSON.stringify(templates));
    const floorServer = await startChild('floor-server.ts', { BENCH_PORT: String(o.port + 1), BENCH_DATABASE_FILE: fFile, BENCH_TEMPLATES: tFile });
    children.push(floorServer);
    const f = await orderToScreens(floorServer, o, bodies, { counters: Array(o.counters).fill(undefined), socket: () => undefined }, 'Flo');
    await floorServer.stop();
    children.pop();

    // 3. a year of history; /bar, Pulse and the reports
    console.log(`History: ${o.days} days…`);
    const hTarget = await dbs.create('history');
    const history = o.days
      ? await generateHistory({ file: hTarget, days: o.days })
      : { orders: 0, days: 0, seconds: 0, firstDate: new Date().toISOString().slice(0, 10), lastDate: new Date().toISOString().slice(0, 10) };
    console.log(`  ${history.orders} orders in ${history.seconds.toFixed(1)} s`);
    const hist = await startChild('jugline-server.ts', { BENCH_PORT: String(o.port + 2), ...dbs.envOf(hTarget), JUGLINE_DIST: o.dist });
    children.push(hist);
    const [cashier, barista, lead, owner] = await Promise.all(['cashier', 'barista', 'lead', 'owner'].map((u) => signIn(hist.url, u)));
    console.log('Rendering /bar…');
    const bar = await renderBar(hist.url, cashier, barista, bodies, [20, 100, 300]);
    console.log('Pulse and reports…');
    const endpoints: Timed[] = await historyEndpoints(hist.url, lead, owner, history.firstDate!, history.lastDate!);
    console.log('Resume storm…');
    const storm = await stormPhase(hist, bodies);
    await hist.stop();
    children.pop();

    // 4. npm start → /readyz
    console.log('npm start → /readyz…');
    const startup = await startupTimes(o.dist, tmp, o.port + 3);
    console.log(
      `  first start ${startup.first.toFixed(0)} ms, restart median ${startup.restart.p50.toFixed(0)} ms (sources through tsx: ${startup.sources.p50.toFixed(0)} ms)`,
    );

    const results: BenchResults = {
      machine: {
        cores: os.cpus().length,
        cpu: os.cpus()[0]?.model?.trim() ?? 'unknown',
        memoryGiB: os.totalmem() / 2 ** 30,
        node: process.version,
        platform: `${os.type()} ${os.release()}`,
        date: new Date().toISOString().slice(0, 10),
        load: [loadAtStart, os.loadavg()[0]],
        nice: os.getPriority(),
      },
      db: o.db,
      args: { sockets: o.sockets, counters: o.counters, rate: o.rate, seconds: o.seconds, big: o.big, days: o.days },
      built,
      jugline: j.result,
      floor: f.result,
      history: { orders: history.orders, days: history.days, seconds: history.seconds, firstDate: history.firstDate!, lastDate: history.lastDate! },
      bar,
      endpoints,
      storm,
      startup,
      weights,
      seconds: (performance.now() - started) / 1000,
    };
    const table = report(results);
    console.log('\n' + table);
    if (o.write) {
      writeInto(o.out, results, table);
      console.log(`Written to ${path.relative(ROOT, o.out)}`);
    }
  } finally {
    await cleanup();
  }
}

// BENCHMARKS.md holds one block per database and a side-by-side block built from both; each
// run's block ends with its results as JSON in a comment, so the other database's run can rebuild
// the side-by-side table without running again.
/** Replace this database's block and the side-by-side block; everything else (notes by hand) stays. */
function writeInto(file: string, results: BenchResults, table: string) {
  let text = existsSync(file) ? readFileSync(file, 'utf8') : '# Benchmarks\n';
  text = putBetween(text, results.db, `${table}\n\n<!-- bench:results ${JSON.stringify(results)} -->`);
  const other = between(text, results.db === 'sqlite' ? 'postgres' : 'sqlite')?.match(RESULTS)?.[1];
  if (other) {
    const both = [results, JSON.parse(other) as BenchResults];
    const sqlite = both.find((r) => r.db === 'sqlite')!;
    const postgres = both.find((r) => r.db === 'postgres')!;
    text = putBetween(text, 'side', sideBySide(sqlite, postgres));
  }
  writeFileSync(file, text);
}

main().then(
  () => process.exit(0),
  (err) => {
    console.error(err);
    process.exit(1);
  },
);
