// The results as one Markdown document: printed by the bench and written into BENCHMARKS.md.
import type { OverloadResult, RunResult } from './load';
import type { Timed } from './pages';
import type { SideResult } from './run';
import type { Summary } from './stats';
import type { StartupResult } from './startup';
import type { StormResult } from './storm';
import type { ScreenWeight } from './weights';

export interface BenchResults {
  /** The database Jugline ran on (the floor always runs on SQLite). */
  db: 'sqlite' | 'postgres';
  machine: { cores: number; cpu: string; memoryGiB: number; node: string; platform: string; date: string; load: number[]; nice: number };
  args: { sockets: number; counters: number; rate: number; seconds: number; big: number; days: number };
  built: boolean;
  jugline: SideResult;
  floor: SideResult;
  history: { orders: number; days: number; seconds: number; firstDate: string; lastDate: string };
  bar: (Timed & { drinks: number })[];
  endpoints: Timed[];
  storm: StormResult;
  /** Left out by runs from before it was measured. */
  startup?: StartupResult;
  weights: ScreenWeight[];
  seconds: number;
}

const ms = (x: number) => (Number.isFinite(x) ? (x < 10 ? x.toFixed(2) : x.toFixed(1)) : '—');
const kb = (bytes: number) => (bytes / 1024).toFixed(1);
const mb = (bytes: number) => (bytes / 2 ** 20).toFixed(1);
const ratio = (a: number, b: number) => (b > 0 && Number.isFinite(a) ? `${(a / b).toFixed(1)}×` : '—');
const mark = (ok: boolean) => (ok ? '✅ met' : '❌ missed');

function row(cells: (string | number)[]) {
  return `| ${cells.join(' | ')} |`;
}

function table(head: string[], rows: (string | number)[][]) {
  return [row(head), row(head.map(() => '---')), ...rows.map(row)].join('\n');
}

function percentileRows(label: string, j: Summary, f: Summary, target = ''): (string | number)[][] {
  return (['p50', 'p95', 'p99', 'max'] as const).map((p) => [`${label} — ${p} (ms)`, ms(j[p]), ms(f[p]), ratio(j[p], f[p]), p === 'p99' ? target : '']);
}

function perSocket(m: {
  before: { heapUsed: number; external: number; rss: number };
  after: { heapUsed: number; external: number; rss: number };
  sockets: number;
}) {
  const heap = (m.after.heapUsed + m.after.external - m.before.heapUsed - m.before.external) / m.sockets;
  const rss = (m.after.rss - m.before.rss) / m.sockets;
  return { heap, rss };
}

function runRows(j: RunResult, f: RunResult, memJ: SideResult['memory'], memF: SideResult['memory'], allTarget: string): (string | number)[][] {
  const pj = perSocket(memJ);
  const pf = perSocket(memF);
  return [
    ...percentileRows('POST /api/orders answered', j.ack, f.ack),
    ...percentileRows('event at a socket (every order × socket)', j.oneSocket, f.oneSocket),
    ...percentileRows(`event at all ${j.sockets} sockets (per order)`, j.allSockets, f.allSockets, allTarget),
    ['orders whose event missed a socket / failed POSTs', `${j.incomplete} / ${j.failures}`, `${f.incomplete} / ${f.failures}`, '', '0'],
    [
      'sustained throughput (orders/s answered)',
      j.throughput.toFixed(1),
      f.throughput.toFixed(1),
      ratio(f.throughput, j.throughput) + ' (floor ÷ Jugline)',
      '',
    ],
    ['server CPU time per order (ms, user + system)', ms(j.cpuPerOrder), ms(f.cpuPerOrder), ratio(j.cpuPerOrder, f.cpuPerOrder), ''],
    [
      'event-loop delay — p50 / p99 / max (ms)',
      `${ms(j.loop.p50)} / ${ms(j.loop.p99)} / ${ms(j.loop.max)}`,
      `${ms(f.loop.p50)} / ${ms(f.loop.p99)} / ${ms(f.loop.max)}`,
      ratio(j.loop.p99, f.loop.p99) + ' (p99)',
      '',
    ],
    ["the load generator's own event-loop delay — p99 (ms)", ms(j.clientLoopP99), ms(f.clientLoopP99), '', ''],
    [
      `server memory with ${j.sockets} sockets — RSS / heap+external (MB)`,
      `${mb(memJ.after.rss)} / ${mb(memJ.after.heapUsed + memJ.after.external)}`,
      `${mb(memF.after.rss)} / ${mb(memF.after.heapUsed + memF.after.external)}`,
      ratio(memJ.after.rss, memF.after.rss) + ' (RSS)',
      '',
    ],
    [
      `memory per socket (${memJ.sockets} added) — heap+external / RSS (KB)`,
      `${kb(pj.heap)} / ${kb(pj.rss)}`,
      `${kb(pf.heap)} / ${kb(pf.rss)}`,
      ratio(pj.heap, pf.heap) + ' (heap)',
      '',
    ],
  ];
}

/** The resume storm: /healthz and a polite screen's resume, before and while one sign-in storms. */
export function stormTable(s: StormResult): string {
  const closes =
    Object.entries(s.closes)
      .map(([code, n]) => `${n}× ${code}`)
      .join(', ') || 'none';
  return [
    `### One sign-in storming the live socket with resumes from 0: ${s.sockets} sockets at 20 resumes/s each for ${s.seconds} s, on a board of 300 open drinks`,
    '',
    table(
      ['figure', 'median (ms)', 'p95 (ms)', 'max (ms)', 'requests'],
      [
        ['GET /healthz, before the storm', ms(s.rest.p50), ms(s.rest.p95), ms(s.rest.max), s.rest.n],
        ['GET /healthz, during the storm', ms(s.during.p50), ms(s.during.p95), ms(s.during.max), s.during.n],
        [
          "another sign-in's screen: resume from 0 → its snapshot, during the storm",
          ms(s.bystander.p50),
          ms(s.bystander.p95),
          ms(s.bystander.max),
          s.bystander.n,
        ],
        ["the server's event-loop delay during the storm (p50 / p99 / max, ms)", ms(s.serverLoop.p50), ms(s.serverLoop.p99), ms(s.serverLoop.max), ''],
        ["the load generator's own event-loop delay during the storm (p99, ms)", '', ms(s.clientLoopP99), '', ''],
      ],
    ),
    '',
    `The storm sent ${s.sent.toLocaleString('en-US')} resumes; ${s.answered.toLocaleString('en-US')} were answered with a snapshot and ` +
      `${s.refused.toLocaleString('en-US')} refused (\`rate_limited\`); the server closed storm sockets ${closes} and the storm reconnected ${s.reconnects} times. ` +
      `The other sign-in's screen had ${s.bystanderRefused ?? 0} upgrades refused (429: it resumes faster than its own sign-in's bucket refills) and tried again a second later.`,
  ].join('\n');
}

/** Twice the most the closed loop took, as an open loop: what is taken stays fast, the rest is refused fast and placed later once. */
export function overloadTable(o: OverloadResult): string {
  const landed = o.resent.left === 0 && o.resent.alreadyThere === 0 && o.distinctOrders === o.sent;
  const grew = o.rssAfter - o.rssBefore;
  return [
    `### Overload: ${o.rate} orders/s (twice the closed loop's most) for ${o.seconds} s, open loop, the same screens connected`,
    '',
    table(
      ['figure', 'median (ms)', 'p99 (ms)', 'max (ms)', 'count', 'target'],
      [
        [
          'taken at once (201): POST → answer',
          ms(o.accepted.p50),
          ms(o.accepted.p99),
          ms(o.accepted.max),
          o.accepted.n,
          `p99 < 250 ms: ${mark(o.accepted.p99 < 250)}`,
        ],
        [
          'refused (503): POST → answer; how many said Retry-After',
          ms(o.refused.p50),
          ms(o.refused.p99),
          ms(o.refused.max),
          `${o.refused.n}; ${o.refusedWithRetryAfter}`,
          `every refusal with Retry-After: ${mark(o.refusedWithRetryAfter === o.refused.n)}`,
        ],
        ['any other answer, or no answer (refused or reset connections)', '', '', '', o.errors, `0: ${mark(o.errors === 0)}`],
        [
          `the refused sent again after Retry-After, same clientOrderId: placed / refused again / already there / never placed (${o.resent.rounds} rounds)`,
          '',
          '',
          '',
          `${o.resent.placed} / ${o.resent.refusedAgain} / ${o.resent.alreadyThere} / ${o.resent.left}`,
          `each placed once (${o.distinctOrders} orders of ${o.sent}): ${mark(landed)}`,
        ],
        [
          "server RSS before → after, after a collection (MB); the server's event-loop delay p99 during (ms)",
          '',
          ms(o.loop.p99),
          '',
          `${mb(o.rssBefore)} → ${mb(o.rssAfter)}`,
          `grew < 32 MB: ${mark(grew < 32 * 2 ** 20)}`,
        ],
        ["the load generator's own event-loop delay p99; its latest send after the order's time (ms)", '', ms(o.clientLoopP99), ms(o.latestSend), '', ''],
      ],
    ),
    ...(o.firstErrors.length ? ['', `First errors: ${o.firstErrors.join(' | ')}`] : []),
  ].join('\n');
}

/** `npm start` → /readyz, the build already made. */
export function startupTable(st: StartupResult): string {
  return [
    '### `npm start` → `/readyz` answering 200 (the build already made; the compiled server on plain Node)',
    '',
    table(
      ['start', 'median (ms)', 'max (ms)', 'starts'],
      [
        ['first start on an empty database (migrations and the demo café)', ms(st.first), ms(st.first), 1],
        ['restart on that database', ms(st.restart.p50), ms(st.restart.max), st.restart.n],
        ['for comparison: the sources through tsx (`node --import tsx server/index.ts`)', ms(st.sources.p50), ms(st.sources.max), st.sources.n],
      ],
    ),
  ].join('\n');
}

export function report(r: BenchResults): string {
  const { jugline: j, floor: f, args: a, machine: m } = r;
  const out: string[] = [];
  out.push(
    `Jugline on **${r.db === 'postgres' ? 'PostgreSQL' : 'SQLite'}**${r.db === 'postgres' ? ' (a throwaway local cluster, on the same machine as everything else)' : ''}; the floor on SQLite.`,
    '',
    `Machine: ${m.cores} cores (${m.cpu}), ${m.memoryGiB.toFixed(0)} GiB, ${m.platform}; Node ${m.node}. Run ${m.date}, ${r.seconds.toFixed(0)} s in all` +
      `${r.built ? ' (including the build)' : ''}:`,
    '',
    '```',
    `npm run bench -- --db ${r.db} --sockets ${a.sockets} --counters ${a.counters} --rate ${a.rate} --seconds ${a.seconds} --big ${a.big} --days ${a.days}`,
    '```',
    '',
    `Load average (1 min) at the start and the end: ${m.load.map((l) => l.toFixed(1)).join(' / ')}` +
      (Math.max(...m.load) > m.cores / 2
        ? ` — **other work was running on this ${m.cores}-core machine; the times are inflated by it**`
        : ' (an idle machine)') +
      (m.nice !== 0 ? `; the bench ran at nice ${m.nice} (ahead of that work for the CPU, not for the disk).` : '.'),
    '',
  );

  const allP99 = j.main.allSockets.p99;
  const floorP99 = f.main.allSockets.p99;
  out.push(
    `### Order → screens: ${a.sockets} sockets, ${a.counters} counters, ${a.rate} orders/s for ${a.seconds} s`,
    '',
    table(
      ['figure', 'Jugline', 'floor', 'Jugline ÷ floor', 'target'],
      [
        ...runRows(j.main, f.main, j.memory, f.memory, `≤ 1.5× floor: ${mark(allP99 <= 1.5 * floorP99)}`),
        [
          `max throughput, closed loop (${a.counters} counters, 5 s) — orders/s; share delivered to every socket`,
          `${j.saturation.throughput.toFixed(0)}; ${(j.saturation.delivered * 100).toFixed(0)} %`,
          `${f.saturation.throughput.toFixed(0)}; ${(f.saturation.delivered * 100).toFixed(0)} %`,
          ratio(f.saturation.throughput, j.saturation.throughput) + ' (floor ÷ Jugline)',
          `floor ÷ Jugline ≤ 2.5×: ${mark(f.saturation.throughput <= 2.5 * j.saturation.throughput)}`,
        ],
        [
          'server CPU time per order in the closed loop (ms)',
          ms(j.saturation.cpuPerOrder),
          ms(f.saturation.cpuPerOrder),
          ratio(j.saturation.cpuPerOrder, f.saturation.cpuPerOrder),
          `≤ 2.5× floor: ${mark(j.saturation.cpuPerOrder <= 2.5 * f.saturation.cpuPerOrder)}`,
        ],
        [
          'event-loop delay in the closed loop — p99 / max (ms)',
          `${ms(j.saturation.loop.p99)} / ${ms(j.saturation.loop.max)}`,
          `${ms(f.saturation.loop.p99)} / ${ms(f.saturation.loop.max)}`,
          '',
          '',
        ],
      ],
    ),
    '',
  );

  if (j.big && f.big) {
    const bigP99 = j.big.run.allSockets.p99;
    out.push(
      `### Order → screens: ${a.big} sockets, ${a.rate} orders/s for ${j.big.run.orders / a.rate} s`,
      '',
      table(
        ['figure', 'Jugline', 'floor', 'Jugline ÷ floor', 'target'],
        runRows(j.big.run, f.big.run, j.big.memory, f.big.memory, `≤ 1.5× floor: ${mark(bigP99 <= 1.5 * f.big.run.allSockets.p99)}`),
      ),
      '',
    );
  }

  if (j.overload) out.push(overloadTable(j.overload), '');

  const barTarget: Record<number, number> = { 100: 8, 300: 20 };
  out.push(
    '### Server rendering of /bar (GET on loopback, signed in as a barista, 60 requests after 8 unmeasured)',
    '',
    table(
      ['open drinks', 'median (ms)', 'p95 (ms)', 'max (ms)', 'HTML (KB)', 'target'],
      r.bar.map((b) => [
        b.drinks,
        ms(b.p50),
        ms(b.p95),
        ms(b.max),
        kb(b.bytes),
        barTarget[b.drinks] ? `median ≤ ${barTarget[b.drinks]} ms: ${mark(b.p50 <= barTarget[b.drinks])}` : '',
      ]),
    ),
    '',
  );

  out.push(
    `### Pulse and reports over ${r.history.days} days of history (${r.history.orders.toLocaleString('en-US')} orders, ${r.history.firstDate} … ${r.history.lastDate}; 40 requests after 5 unmeasured)`,
    '',
    table(
      ['endpoint', 'median (ms)', 'p95 (ms)', 'max (ms)', 'answer (KB)', 'target p95 < 100 ms'],
      r.endpoints.map((e) => [e.what, ms(e.p50), ms(e.p95), ms(e.max), kb(e.bytes), mark(e.p95 < 100)]),
    ),
    '',
  );

  out.push(stormTable(r.storm), '');
  if (r.startup) out.push(startupTable(r.startup), '');

  const weightTarget: Record<string, number> = { pickup: 90, bar: 110, counter: 140 };

  out.push(
    "### Client weight per screen (gzip, from the build manifest: entry + the screen's chunks and their imports)",
    '',
    table(
      ['screen', 'JS (KB gzip)', 'CSS (KB gzip)', 'files', 'loaded later by the screen (KB gzip)', 'target'],
      r.weights.map((w) => [
        w.screen,
        kb(w.jsGzip),
        kb(w.cssGzip),
        w.files,
        w.laterJsGzip ? kb(w.laterJsGzip) : '—',
        weightTarget[w.screen] ? `JS ≤ ${weightTarget[w.screen]} KB: ${mark(w.jsGzip / 1024 <= weightTarget[w.screen])}` : '',
      ]),
    ),
  );
  return out.join('\n');
}

/** The figures a café group weighs when it moves to PostgreSQL, from one run on each database. */
export function sideBySide(sqlite: BenchResults, postgres: BenchResults): string {
  const both = (label: string, pick: (r: BenchResults) => number | undefined, unit: (x: number) => string = ms): (string | number)[] => {
    const a = pick(sqlite);
    const b = pick(postgres);
    return [label, a === undefined ? '—' : unit(a), b === undefined ? '—' : unit(b), a !== undefined && b !== undefined ? ratio(b, a) : '—'];
  };
  const bar = (drinks: number) => (r: BenchResults) => r.bar.find((b) => b.drinks === drinks)?.p50;
  const endpoint = (what: string, p: 'p50' | 'p95') => (r: BenchResults) => r.endpoints.find((e) => e.what === what)?.[p];
  const whole = (x: number) => x.toFixed(0);
  const run = (r: BenchResults) => `${r.machine.date}, load ${r.machine.load.map((l) => l.toFixed(1)).join(' / ')}`;
  return [
    `SQLite run: ${run(sqlite)}. PostgreSQL run: ${run(postgres)}. Each column comes from its own run of \`npm run bench\` (blocks above);`,
    'the last column is PostgreSQL ÷ SQLite (above 1×: slower or bigger on PostgreSQL).',
    '',
    table(
      ['figure', 'SQLite', 'PostgreSQL', 'PostgreSQL ÷ SQLite'],
      [
        both(`POST /api/orders answered — p50 (ms), ${sqlite.args.sockets} sockets`, (r) => r.jugline.main.ack.p50),
        both('POST /api/orders answered — p99 (ms)', (r) => r.jugline.main.ack.p99),
        both('event at every socket — p99 (ms)', (r) => r.jugline.main.allSockets.p99),
        both('server CPU time per order (ms)', (r) => r.jugline.main.cpuPerOrder),
        both(`max throughput, closed loop (orders/s)`, (r) => r.jugline.saturation.throughput, whole),
        both('server CPU time per order in the closed loop (ms)', (r) => r.jugline.saturation.cpuPerOrder),
        both(`event at every socket, ${sqlite.args.big} sockets — p99 (ms)`, (r) => r.jugline.big?.run.allSockets.p99),
        both('/bar rendered, 20 open drinks — median (ms)', bar(20)),
        both('/bar rendered, 100 open drinks — median (ms)', bar(100)),
        both('/bar rendered, 300 open drinks — median (ms)', bar(300)),
        both(
          `history written, ${sqlite.history.days} days (s)`,
          (r) => r.history.seconds,
          (x) => x.toFixed(1),
        ),
        ...sqlite.endpoints.flatMap((e) => [both(`${e.what} — median (ms)`, endpoint(e.what, 'p50')), both(`${e.what} — p95 (ms)`, endpoint(e.what, 'p95'))]),
        both('GET /healthz during the resume storm — median (ms)', (r) => r.storm.during.p50),
      ],
    ),
  ].join('\n');
}
