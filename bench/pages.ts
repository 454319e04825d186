// Server rendering and history: sequential requests against a running Jugline server on loopback,
// each timed from send to the last byte of the answer, after a few unmeasured warm-up requests.
import { randomUUID } from 'node:crypto';
import { Agent } from 'node:http';
import { postOrder, type OrderBody } from './load';
import { summarize, type Summary } from './stats';

const agent = new Agent({ keepAlive: true, maxSockets: 1 });

async function get(url: string, cookie: string): Promise<{ status: number; bytes: number }> {
  const res = await fetch(url, { headers: { cookie }, redirect: 'manual' });
  const body = await res.arrayBuffer();
  return { status: res.status, bytes: body.byteLength };
}

export interface Timed extends Summary {
  what: string;
  bytes: number;
}

/** `n` sequential GETs after `warm` unmeasured ones; refuses a non-200 answer. */
export async function timeGet(what: string, url: string, cookie: string, n = 60, warm = 8): Promise<Timed> {
  const times: number[] = [];
  let bytes = 0;
  for (let i = 0; i < warm + n; i++) {
    const t0 = performance.now();
    const res = await get(url, cookie);
    const ms = performance.now() - t0;
    if (res.status !== 200) throw new Error(`${what}: GET ${url} answered ${res.status}`);
    if (i >= warm) times.push(ms);
    bytes = res.bytes;
  }
  return { what, bytes, ...summarize(times) };
}

async function openDrinks(url: string, cookie: string): Promise<number> {
  const res = await fetch(`${url}/api/tickets?view=open`, { headers: { cookie } });
  const { tickets } = (await res.json()) as { tickets: { drinks: { status: string }[] }[] };
  return tickets.reduce((n, t) => n + t.drinks.filter((d) => d.status !== 'done').length, 0);
}

/** Post orders (a mix of one- to three-drink tickets) until exactly `target` drinks are open. */
export async function fillOpenDrinks(url: string, cashier: string, bodies: OrderBody[], target: number): Promise<number> {
  let open = await openDrinks(url, cashier);
  const counter = { agent, cookie: cashier };
  for (let k = 0; open < target; k++) {
    const fits = bodies.filter((b) => b.barDrinks > 0 && b.barDrinks <= target - open);
    const body = fits[k % fits.length];
    const res = await postOrder(url, counter, {
      clientOrderId: randomUUID(),
      customerName: `Render ${k + 1}`,
      items: body.items,
      payment: { method: 'cash', tenderedCents: 10_000 },
    });
    if (res.status !== 201) throw new Error(`posting an order answered ${res.status}: ${res.text}`);
    open += body.barDrinks;
  }
  const counted = await openDrinks(url, cashier);
  if (counted !== target) throw new Error(`wanted ${target} open drinks, the server has ${counted}`);
  return counted;
}

export async function renderBar(url: string, cashier: string, barista: string, bodies: OrderBody[], counts: number[]): Promise<(Timed & { drinks: number })[]> {
  const out: (Timed & { drinks: number })[] = [];
  for (const drinks of counts) {
    await fillOpenDrinks(url, cashier, bodies, drinks);
    const t = await timeGet(`/bar, ${drinks} open drinks`, `${url}/bar`, barista, 60);
    out.push({ ...t, drinks });
  }
  return out;
}

export async function historyEndpoints(url: string, lead: string, owner: string, from: string, to: string): Promise<Timed[]> {
  const shifts = (await (await fetch(`${url}/api/reports/shifts`, { headers: { cookie: owner } })).json()) as {
    shifts: { id: number; closedAt: string | null }[];
  };
  const lastClosed = shifts.shifts.find((s) => s.closedAt)?.id;
  const range = `from=${from}&to=${to}`;
  const list: [string, string, string][] = [
    ['Pulse — GET /api/pulse', `/api/pulse`, lead],
    ['Report, a year — GET /api/reports/range', `/api/reports/range?${range}`, owner],
    ['Report, a year, CSV — GET /api/reports/range.csv', `/api/reports/range.csv?${range}`, owner],
    ['Shifts — GET /api/reports/shifts', `/api/reports/shifts`, owner],
    ...(lastClosed ? ([['Shift report — GET /api/reports/shift/:id', `/api/reports/shift/${lastClosed}`, owner]] as [string, string, string][]) : []),
    ['Ticket history, a year, page 1 — GET /api/reports/tickets', `/api/reports/tickets?${range}`, owner],
    ['Ticket search, a year — GET /api/reports/tickets?q=', `/api/reports/tickets?${range}&q=Ash`, owner],
  ];
  const out: Timed[] = [];
  for (const [what, path, cookie] of list) out.push(await timeGet(what, `${url}${path}`, cookie, 40, 5));
  return out;
}
