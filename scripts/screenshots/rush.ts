// A scripted morning at the demo café, played through the real API on a clock the script moves:
// the lead opens the shift, orders arrive slowly and then at the rush, two baristas (and the lead,
// later) start and bump drinks in pairs by milk, customers collect a minute or two after "ready".
// It stops mid-rush, so the screens show drinks queued, being made and ready, with believable ages.
import type { APIRequestContext } from '@playwright/test';
import { createRandom } from '@scripts/history/random';

/** Moves the server's clock (never backwards). */
export interface SceneClock {
  nowMs(): number;
  set(ms: number): void;
}

export interface Staff {
  cashier: APIRequestContext;
  lead: APIRequestContext;
  baristas: { name: string; api: APIRequestContext; fromMs: number }[];
}

interface MenuItem {
  id: number;
  name: string;
  station: string;
  takesMilk: boolean;
  sizes: { id: number; name: string }[];
  extraGroupIds: number[];
}
interface Menu {
  items: MenuItem[];
  milks: { id: number; name: string }[];
  extras: { id: number; name: string; groupId: number }[];
}

const FIRST = [
  'Maya',
  'Idris',
  'Harriet',
  'Kenji',
  'Lena',
  'Mateo',
  'Nadia',
  'Otis',
  'Rosa',
  'Silas',
  'Tess',
  'Amir',
  'Cleo',
  'Dev',
  'Elsa',
  'Farah',
  'Gus',
  'Hana',
  'Jonas',
  'Leila',
  'Malik',
  'Nora',
  'Omar',
  'Pia',
  'Rafa',
  'Sade',
  'Uma',
  'Wen',
  'Yusuf',
  'Zadie',
  'Beatrix',
  'Emeka',
  'Isla',
  'Luca',
  'Marisol',
  'Nico',
  'Odette',
  'Quinn',
  'Remy',
  'Sanne',
  'Vera',
  'Arlo',
  'Juno',
  'Felix',
];
const LAST = [
  'Okafor',
  'Lindqvist',
  'Moreau',
  'Tanaka',
  'Brennan',
  'Alvarez',
  'Haddad',
  'Kowalski',
  'Reyes',
  'Abernathy',
  'Singh',
  'Duarte',
  'Whitcombe',
  'Nakamura',
  'Ferreira',
  'Osei',
  'Hale',
  'Castell',
  'Marsh',
  'Petrov',
];

/** What people order in the morning (name, weight), and the milks they ask for (demo-scenario.md's mix). */
const DRINKS: [string, number][] = [
  ['Latte', 30],
  ['Flat white', 16],
  ['Cappuccino', 16],
  ['Long black', 8],
  ['Espresso', 5],
  ['Mocha', 6],
  ['Chai latte', 6],
  ['Iced latte', 5],
  ['Batch brew', 8],
];
const MILKS: [string, number][] = [
  ['Whole', 46],
  ['Oat', 26],
  ['Skim', 10],
  ['Almond', 9],
  ['Soy', 6],
  ['Coconut', 3],
];
const FOOD: [string, number][] = [
  ['Butter croissant', 4],
  ['Almond croissant', 2],
  ['Banana bread', 3],
  ['Bottled water', 1],
];

export interface RushResult {
  orders: { id: number; number: number; name: string }[];
  /** An order with an allergy and an e-mailed receipt, for the receipt and cup-label screens. */
  showcaseOrderId: number;
}

export async function playRush(opts: { clock: SceneClock; staff: Staff; startMs: number; endMs: number; seed?: number }): Promise<RushResult> {
  const { clock, staff, startMs, endMs } = opts;
  const rnd = createRandom(opts.seed ?? 7);
  const menu: Menu = await json(staff.cashier.get('/api/menu'));
  const item = (name: string) => menu.items.find((i) => i.name === name) ?? fail(`the demo menu has no "${name}"`);
  const milk = (name: string) => menu.milks.find((m) => m.name === name)?.id ?? fail(`the demo menu has no milk "${name}"`);
  /** The extra, if the item offers its group. */
  const extraId = (it: MenuItem, name: string) => menu.extras.find((m) => m.name === name && it.extraGroupIds.includes(m.groupId))?.id;
  const at = (minutes: number) => startMs + minutes * 60_000;

  // 06:25: the lead opens the shift with two on bar and the 4-minute target
  clock.set(at(-5));
  await json(staff.lead.post('/api/shifts', { data: { openingFloatCents: 15_000, baristasOnBar: 2, waitTargetSeconds: 240 } }));

  // Arrival times: a quiet start, then the rush from about 07:20 (startMs is 06:30 when the doors open)
  const arrivals: number[] = [];
  for (let t = at(2); t < endMs;) {
    arrivals.push(t);
    // quiet until 07:20, busy to 07:50, then the commuter wave that builds the queue on screen
    const meanMs = t < at(50) ? 140_000 : t < at(80) ? 50_000 : 27_000;
    t += rnd.exponential(meanMs) + 5_000;
  }

  type Drink = { id: number; orderId: number; milk: string | null; allergy: boolean };
  const queue: Drink[] = [];
  const orders: RushResult['orders'] = [];
  const collections: { atMs: number; orderId: number }[] = [];
  const busyUntil = new Map<number, { atMs: number; drinks: Drink[] }>();
  let showcaseOrderId = 0;
  let third = false;

  const placeOrder = async (extra: Record<string, unknown> = {}, lines?: unknown[]) => {
    // no first name twice among the last twenty orders, so Pickup reads like a real morning
    const recent = new Set(orders.slice(-20).map((o) => o.name.split(' ')[0]));
    const first = rnd.pick(FIRST.filter((f) => !recent.has(f)));
    const name = `${first} ${rnd.pick(LAST)}`;
    const count = rnd.weighted([
      [1, 70],
      [2, 24],
      [3, 6],
    ] as const);
    const items =
      lines ??
      Array.from({ length: count }, () => {
        const it = item(rnd.weighted(DRINKS));
        const size =
          it.sizes.length > 1
            ? it.sizes[
                rnd.weighted([
                  [0, 25],
                  [1, 55],
                  [2, 20],
                ] as const) % it.sizes.length
              ]
            : undefined;
        const mods = [
          rnd.chance(0.06) ? extraId(it, 'Decaf') : undefined,
          rnd.chance(0.1) ? extraId(it, rnd.pick(['Vanilla syrup', 'Caramel syrup'])) : undefined,
        ];
        return {
          menuItemId: it.id,
          sizeId: size?.id,
          milkId: it.takesMilk ? milk(rnd.weighted(MILKS)) : undefined,
          extraIds: mods.filter((m): m is number => m !== undefined),
        };
      });
    if (!lines && rnd.chance(0.3)) items.push({ menuItemId: item(rnd.weighted(FOOD)).id, sizeId: undefined, milkId: undefined, extraIds: [] });
    const payment = rnd.chance(0.65) ? { method: 'card', paymentMethod: 'pm_card_visa' } : { method: 'cash', tenderedCents: 5_000 };
    const body = { clientOrderId: crypto.randomUUID(), customerName: name, service: rnd.chance(0.7) ? 'takeaway' : 'dine_in', items, payment, ...extra };
    const { order } = await json(staff.cashier.post('/api/orders', { data: body }));
    orders.push({ id: order.id, number: order.number, name: body.customerName });
    const allergy = ((body as { allergens?: string[] }).allergens ?? []).length > 0;
    for (const line of order.lines as { id: number; station: string; milkName: string | null }[]) {
      if (line.station === 'bar') queue.push({ id: line.id, orderId: order.id, milk: line.milkName, allergy });
    }
    return order as { id: number };
  };

  const finishDrinks = async (baristaIndex: number) => {
    const job = busyUntil.get(baristaIndex)!;
    busyUntil.delete(baristaIndex);
    await json(staff.baristas[baristaIndex].api.post('/api/drinks/bump', { data: { drinkIds: job.drinks.map((d) => d.id) } }));
    for (const orderId of new Set(job.drinks.map((d) => d.orderId))) {
      if (!queue.some((d) => d.orderId === orderId) && ![...busyUntil.values()].some((j) => j.drinks.some((d) => d.orderId === orderId))) {
        collections.push({ atMs: clock.nowMs() + rnd.between(45_000, 260_000), orderId });
      }
    }
  };

  const startDrinks = async (baristaIndex: number) => {
    const first = queue.shift();
    if (!first) return;
    const drinks = [first];
    // a second drink with the same milk shares the jug (and the grinder's pair of shots)
    const mate = first.milk ? queue.findIndex((d) => d.milk === first.milk && !d.allergy) : -1;
    if (mate >= 0 && !first.allergy) drinks.push(...queue.splice(mate, 1));
    const api = staff.baristas[baristaIndex].api;
    for (const d of drinks.filter((d) => d.allergy)) await json(api.post(`/api/drinks/${d.id}/acknowledge-allergy`));
    await json(api.post('/api/drinks/start', { data: { drinkIds: drinks.map((d) => d.id) } }));
    const seconds = drinks.length === 1 ? rnd.normal(84, 10) : rnd.normal(122, 12);
    busyUntil.set(baristaIndex, { atMs: clock.nowMs() + Math.max(40, seconds) * 1000, drinks });
  };

  // The event loop: always the earliest of the next arrival, a barista finishing, a collection.
  let next = 0;
  for (;;) {
    const candidates: { atMs: number; run: () => Promise<void> }[] = [];
    if (next < arrivals.length) {
      const i = next;
      candidates.push({ atMs: arrivals[i], run: async () => void ((next = i + 1), await placeOrder()) });
    }
    for (const [b, job] of busyUntil) candidates.push({ atMs: job.atMs, run: () => finishDrinks(b) });
    for (const c of collections) {
      candidates.push({
        atMs: c.atMs,
        run: async () => {
          collections.splice(collections.indexOf(c), 1);
          await json(staff.cashier.post(`/api/tickets/${c.orderId}/collect`));
        },
      });
    }
    const soonest = candidates.sort((a, b) => a.atMs - b.atMs)[0];
    if (!soonest || soonest.atMs >= endMs) break;
    clock.set(soonest.atMs);
    await soonest.run();
    // the lead steps onto the bar when the queue builds
    if (!third && clock.nowMs() >= at(80)) {
      third = true;
      await json(staff.lead.post('/api/shifts/current/baristas', { data: { baristasOnBar: 3 } }));
    }
    for (let b = 0; b < staff.baristas.length; b++) {
      if (!busyUntil.has(b) && queue.length > 0 && clock.nowMs() >= staff.baristas[b].fromMs) await startDrinks(b);
    }
    // the showcase order near the end: an allergy, here, a receipt by mail
    if (!showcaseOrderId && clock.nowMs() >= endMs - 150_000) {
      const order = await placeOrder(
        {
          allergens: ['tree nuts'],
          allergyNote: 'Tree nut allergy, carries an EpiPen',
          customerEmail: 'harriet.moreau@example.test',
          service: 'dine_in',
          customerName: 'Harriet Moreau',
        },
        [
          { menuItemId: item('Latte').id, sizeId: item('Latte').sizes[1]?.id, milkId: milk('Oat'), extraIds: [] },
          { menuItemId: item('Cappuccino').id, sizeId: item('Cappuccino').sizes[0]?.id, milkId: milk('Whole'), extraIds: [] },
          { menuItemId: item('Banana bread').id, extraIds: [] },
        ],
      );
      showcaseOrderId = order.id;
    }
  }
  clock.set(endMs);
  return { orders, showcaseOrderId };
}

async function json(res: Promise<{ ok(): boolean; status(): number; url(): string; text(): Promise<string> }>) {
  const r = await res;
  const text = await r.text();
  if (!r.ok()) throw new Error(`the demo rush: ${r.url()} answered ${r.status()}: ${text.slice(0, 300)}`);
  return text ? JSON.parse(text) : {};
}

function fail(message: string): never {
  throw new Error(`the demo rush: ${message}`);
}

/** What the screens will show: open drinks and the oldest ticket's age, for the run's log. */
export function describeBoard(board: { now: string; tickets: { firedAt: string; status: string; drinks: { status: string }[] }[] }): string {
  const open = board.tickets.filter((t) => t.status === 'open');
  const drinks = open.flatMap((t) => t.drinks.filter((d) => d.status !== 'done'));
  const oldest = Math.max(0, ...open.map((t) => Date.parse(board.now) - Date.parse(t.firedAt)));
  const ready = board.tickets.filter((t) => t.status === 'ready').length;
  return `${open.length} open tickets (${drinks.length} drinks, oldest ${Math.floor(oldest / 60_000)}:${String(Math.floor(oldest / 1000) % 60).padStart(2, '0')}), ${ready} ready`;
}
