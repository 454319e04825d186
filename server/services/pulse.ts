// The Pulse board's numbers, from today's tickets (a day is a few hundred: they are read once and
// summarised in plain functions).
import { staffingAdvice, type ErlangResult } from '../../src/domain/erlang';
import type { PulseView } from '../../src/domain/pulse';
import { median, PERCENTILE_METHOD, summarizeWaits } from '../../src/domain/stats';
import type { Deps } from './deps';
import { pulseBeanAlerts } from './beans-alerts';
import { loadLocation } from './menu';
import { businessDate } from './orders';
import { expectedCash, openShiftOf } from './shifts';

const MIN = 60_000;
const BUCKET_MS = 15 * MIN;
/** With nothing measured yet, assume a barista finishes a drink a minute (common practice, rough). */
const DEFAULT_SERVICE_PER_MINUTE = 1;

const secondsBetween = (a: string, b: string) => (Date.parse(b) - Date.parse(a)) / 1000;

const erlangView = (r: ErlangResult) => ({
  stable: r.stable,
  probabilityOfWaiting: r.probabilityOfWaiting,
  meanWaitSeconds: Number.isFinite(r.meanWaitSeconds) ? r.meanWaitSeconds : null,
});

export async function pulse(deps: Deps, locationId: number): Promise<PulseView> {
  const nowDate = deps.clock();
  const now = nowDate.getTime();
  const location = await loadLocation(deps.db, locationId);
  const shift = await openShiftOf(deps.db, locationId);
  const target = location.waitTargetSeconds;
  const day = businessDate(nowDate, location.timeZone);

  const orders = await deps.db('orders')
    .where({ location_id: locationId, business_date: day })
    .whereNotNull('fired_at')
    .whereNot({ status: 'void' })
    .select('id', 'number', 'customer_name', 'status', 'fired_at', 'ready_at', 'quoted_wait_seconds');
  const drinks = await deps.db('order_items')
    .join('orders', 'orders.id', 'order_items.order_id')
    .join('menu_items', 'menu_items.id', 'order_items.menu_item_id')
    .join('menu_categories', 'menu_categories.id', 'menu_items.category_id')
    .leftJoin('users', 'users.id', 'order_items.done_by')
    .leftJoin('users as starter', 'starter.id', 'order_items.started_by')
    .where({ 'orders.location_id': locationId, 'orders.business_date': day, 'order_items.station': 'bar' })
    .whereNotNull('orders.fired_at')
    // as for the tickets above: an order refunded in full before it was made left the bar
    .whereNot('orders.status', 'void')
    .select(
      'order_items.order_id',
      'order_items.status',
      'order_items.started_at',
      'order_items.done_at',
      'orders.fired_at',
      'users.name as bumper',
      'starter.name as starter',
      'menu_categories.name as category',
    );
  // who made a drink: whoever started it, else whoever bumped it
  for (const d of drinks) d.maker = d.starter ?? d.bumper ?? null;
  const barOrders = new Set(drinks.map((d) => d.order_id));
  const tickets = orders.filter((o) => barOrders.has(o.id));
  const done = tickets.filter((o) => o.ready_at);
  const since = shift ? Date.parse(shift.openedAt) : Math.min(now, ...tickets.map((t) => Date.parse(t.fired_at)));

  const waitsSince = (fromMs: number) =>
    done.filter((o) => Date.parse(o.ready_at) >= fromMs).map((o) => secondsBetween(o.fired_at, o.ready_at));
  const drinksSince = (fromMs: number) => drinks.filter((d) => Date.parse(d.fired_at) >= fromMs).length;
  const windows = [15, 30, 60, null].map((minutes) => {
    const from = minutes === null ? since : now - minutes * MIN;
    // a rate over less than 15 minutes would read three drinks as "45 per 15 min"
    const spanMin = Math.max(15, (now - from) / MIN);
    return {
      label: minutes === null ? (shift ? 'This shift' : 'Today') : `Last ${minutes} min`,
      minutes,
      waits: summarizeWaits(waitsSince(from), target),
      drinksPer15: Math.round((drinksSince(from) / spanMin) * 15 * 10) / 10,
    };
  });

  const buckets = [];
  for (let start = Math.floor(since / BUCKET_MS) * BUCKET_MS; start <= now; start += BUCKET_MS) {
    const inBucket = (iso: string) => Date.parse(iso) >= start && Date.parse(iso) < start + BUCKET_MS;
    const waits = done.filter((o) => inBucket(o.fired_at)).map((o) => secondsBetween(o.fired_at, o.ready_at));
    const s = summarizeWaits(waits, target);
    buckets.push({
      start: new Date(start).toISOString(),
      arrivals: tickets.filter((o) => inBucket(o.fired_at)).length,
      drinks: drinks.filter((d) => inBucket(d.fired_at)).length,
      medianWaitSeconds: s.medianSeconds,
      p90WaitSeconds: s.p90Seconds,
    });
  }

  const quoted = done.filter((o) => o.quoted_wait_seconds !== null);
  const actual = quoted.map((o) => secondsBetween(o.fired_at, o.ready_at));
  const avg = (xs: number[]) => (xs.length ? xs.reduce((a, b) => a + b, 0) / xs.length : null);

  const made = drinks.filter((d) => d.status === 'done' && d.started_at && d.done_at);
  const makeSeconds = (ds: typeof made) => ds.map((d) => secondsBetween(d.started_at, d.done_at)).filter((s) => s > 0);
  const groupBy = (key: 'maker' | 'category') =>
    [...new Set(made.map((d) => d[key] ?? '—'))].map((name) => {
      const mine = made.filter((d) => (d[key] ?? '—') === name);
      const times = makeSeconds(mine);
      return { name, drinks: mine.length, medianMakeSeconds: times.length ? median(times) : null };
    });

  // Staffing: arrivals over the last 30 minutes; service rate from the last hour's make times.
  const arrivalsPerMinute = drinksSince(now - 30 * MIN) / 30;
  const recentMake = makeSeconds(made.filter((d) => Date.parse(d.done_at) >= now - 60 * MIN));
  const servicePerMinutePerBarista = recentMake.length ? 60 / median(recentMake) : DEFAULT_SERVICE_PER_MINUTE;
  const baristas = shift?.baristasOnBar ?? location.baristasOnBar;
  const advice = staffingAdvice({ arrivalsPerMinute, servicePerMinutePerServer: servicePerMinutePerBarista, baristas, targetSeconds: target });

  const rolling = windows[1].waits;
  const alert =
    rolling.p90Seconds !== null && rolling.p90Seconds > target
      ? `Waits are slipping: 90 % of tickets in the last 30 min took up to ${(rolling.p90Seconds / 60).toFixed(1)} min, over the ${Math.round(target / 60)} min target.`
      : null;

  return {
    now: nowDate.toISOString(),
    targetSeconds: target,
    percentileMethod: PERCENTILE_METHOD,
    shift,
    expectedCashCents: shift ? await expectedCash(deps.db, shift.id) : null,
    open: tickets
      .filter((o) => o.status === 'open')
      .sort((a, b) => a.fired_at.localeCompare(b.fired_at))
      .map((o) => {
        const mine = drinks.filter((d) => d.order_id === o.id);
        return {
          id: o.id,
          number: o.number,
          customerName: o.customer_name,
          firedAt: o.fired_at,
          ageSeconds: Math.max(0, Math.floor((now - Date.parse(o.fired_at)) / 1000)),
          drinks: mine.length,
          drinksLeft: mine.filter((d) => d.status !== 'done').length,
          makers: [...new Set(mine.map((d) => d.maker).filter(Boolean))] as string[],
        };
      }),
    windows,
    buckets,
    quoteVsActual: {
      count: quoted.length,
      meanQuotedSeconds: avg(quoted.map((o) => o.quoted_wait_seconds)),
      meanActualSeconds: avg(actual),
      shareLongerThanQuoted: quoted.length ? actual.filter((a, i) => a > quoted[i].quoted_wait_seconds).length / quoted.length : null,
    },
    perBarista: groupBy('maker').map(({ name, ...rest }) => ({ name, ...rest })),
    perCategory: groupBy('category').map(({ name, ...rest }) => ({ category: name, ...rest })),
    staffing: {
      inputs: { arrivalsPerMinute, servicePerMinutePerBarista, baristas },
      now: erlangView(advice.now),
      withOneMore: erlangView(advice.withOneMore),
      sentence: advice.sentence,
    },
    alert,
    beanAlerts: await pulseBeanAlerts(deps.db, locationId, nowDate, location.timeZone),
  };
}
