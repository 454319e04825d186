// The Pulse board's numbers. The unit is the open shift, whatever the calendar day (a shift opened
// at 22:00 keeps its tickets past midnight); with no shift open, today. The rolling windows look
// back from now across midnight too. A day's tickets are a few hundred: they are read once and
// summarised in plain functions.
import type { Knex } from 'knex';
import { staffingAdvice, type ErlangResult } from '@/domain/erlang';
import { fraction } from '@/domain/fraction';
import { durationWords } from '@/domain/format';
import { bumpShares } from '@/domain/make-times';
import { pulseTips, type PulseView } from '@/domain/pulse';
import { NO_TIPS } from '@/domain/reports';
import { TIPS_OFF } from '@/domain/tips';
import { DEFAULT_MAKE_SECONDS, DEFAULT_WEIGHT_DRINKS, quoteWaitSeconds } from '@/domain/quote';
import { median, PERCENTILE_METHOD, summarizeWaits } from '@/domain/stats';
import { staffingSentence } from '@/domain/wait-now';
import type { Deps } from '@server/deps';
import { pulseBeanAlerts } from '@server/beans/alerts';
import { tipsByDate } from '@server/reports/tips';
import { loadLocation } from '@server/menu/menu';
import { businessDate } from '@/domain/business-date';
import { barNow, PACE_WINDOW_MS } from '@server/orders/quotes';
import { expectedCash, openShiftOf } from './shifts';

const MIN = 60_000;
const BUCKET_MS = 15 * MIN;
/** Arrivals for the staffing estimate: the last 30 minutes. */
const ARRIVALS_WINDOW_MIN = 30;
/** Orders created this long ago may still count: a café-local day is at most 25 hours long. */
const LOOKBACK_MS = 26 * 60 * MIN;

const secondsBetween = (a: string, b: string) => (Date.parse(b) - Date.parse(a)) / 1000;

interface OrderRow {
  id: number;
  number: number;
  customer_name: string;
  status: string;
  fired_at: string;
  ready_at: string | null;
  quoted_wait_seconds: number | null;
  shift_id: number | null;
  business_date: string;
}

interface DrinkRow {
  order_id: number;
  status: string;
  started_at: string | null;
  done_at: string | null;
  bump_seq: number | null;
  fired_at: string;
  bumper: string | null;
  starter: string | null;
  category: string;
}

const erlangView = (r: ErlangResult) => ({
  stable: r.stable,
  probabilityOfWaiting: r.probabilityOfWaiting,
  meanWaitSeconds: Number.isFinite(r.meanWaitSeconds) ? r.meanWaitSeconds : null,
});

/**
 * The orders Pulse may need: the last day's (today's and the rolling windows'), every ticket still
 * open, and the open shift's (a shift is one location's). Each branch names its own columns so
 * SQLite reads each through an index of its own (a MULTI-INDEX OR), not the location's whole history.
 */
function pulseOrders(q: Knex.QueryBuilder, locationId: number, sinceIso: string, shiftId: number | null) {
  return q.where((w) => {
    w.where((x) => x.where('orders.location_id', locationId).where('orders.created_at', '>=', sinceIso));
    w.orWhere((x) => x.where({ 'orders.location_id': locationId, 'orders.status': 'open' }));
    if (shiftId !== null) w.orWhere('orders.shift_id', shiftId);
  });
}

export async function pulse(deps: Deps, locationId: number): Promise<PulseView> {
  const nowDate = deps.clock();
  const now = nowDate.getTime();
  const location = await loadLocation(deps.db, locationId);
  const shift = await openShiftOf(deps.db, locationId);
  const target = location.waitTargetSeconds;
  const day = businessDate(nowDate, location.timeZone);
  const sinceIso = new Date(now - LOOKBACK_MS).toISOString();

  const orders: OrderRow[] = await pulseOrders(deps.db('orders'), locationId, sinceIso, shift?.id ?? null)
    .whereNotNull('fired_at')
    .whereNot({ status: 'void' })
    .select('id', 'number', 'customer_name', 'status', 'fired_at', 'ready_at', 'quoted_wait_seconds', 'shift_id', 'business_date');
  const drinkRows: DrinkRow[] = await pulseOrders(
    deps.db('order_items').join('orders', 'orders.id', 'order_items.order_id'),
    locationId,
    sinceIso,
    shift?.id ?? null,
  )
    .join('menu_items', 'menu_items.id', 'order_items.menu_item_id')
    .join('menu_categories', 'menu_categories.id', 'menu_items.category_id')
    .leftJoin('users', 'users.id', 'order_items.done_by')
    .leftJoin('users as starter', 'starter.id', 'order_items.started_by')
    .where('order_items.station', 'bar')
    .whereNotNull('orders.fired_at')
    // as for the tickets above: an order refunded in full before it was made left the bar
    .whereNot('orders.status', 'void')
    .select(
      'order_items.order_id',
      'order_items.status',
      'order_items.started_at',
      'order_items.done_at',
      'order_items.bump_seq',
      'orders.fired_at',
      'users.name as bumper',
      'starter.name as starter',
      'menu_categories.name as category',
    );
  // who made a drink: whoever started it, else whoever bumped it
  const drinks = drinkRows.map((d) => ({ ...d, maker: d.starter ?? d.bumper ?? null }));

  // The shift's tickets (or today's, with no shift open): the "This shift" window, quote vs actual
  // and the make times per barista and category.
  const inUnit = (o: { shift_id: number | null; business_date: string }) => (shift ? o.shift_id === shift.id : o.business_date === day);
  const unitOrders = new Set(orders.filter(inUnit).map((o) => o.id));
  const barOrders = new Set(drinks.map((d) => d.order_id));
  const tickets = orders.filter((o) => barOrders.has(o.id));
  const done = tickets.filter((o): o is OrderRow & { ready_at: string } => o.ready_at !== null);
  const unitDone = done.filter((o) => unitOrders.has(o.id));
  const unitDrinks = drinks.filter((d) => unitOrders.has(d.order_id));
  const since = shift ? Date.parse(shift.openedAt) : Math.min(now, ...tickets.filter((o) => unitOrders.has(o.id)).map((t) => Date.parse(t.fired_at)));

  const waitOf = (o: (typeof done)[number]) => secondsBetween(o.fired_at, o.ready_at);
  const windows = [15, 30, 60, null].map((minutes) => {
    const from = minutes === null ? since : now - minutes * MIN;
    const ready = minutes === null ? unitDone : done.filter((o) => Date.parse(o.ready_at) >= from);
    const fired = minutes === null ? unitDrinks.length : drinks.filter((d) => Date.parse(d.fired_at) >= from).length;
    // a rate over less than 15 minutes would read three drinks as "45 per 15 min"
    const spanMin = Math.max(15, (now - from) / MIN);
    return {
      label: minutes === null ? (shift ? 'This shift' : 'Today') : `Last ${minutes} min`,
      minutes,
      waits: summarizeWaits(ready.map(waitOf), target),
      drinksPer15: Math.round((fired / spanMin) * 15 * 10) / 10,
    };
  });

  const buckets = [];
  for (let start = Math.floor(since / BUCKET_MS) * BUCKET_MS; start <= now; start += BUCKET_MS) {
    const inBucket = (iso: string) => Date.parse(iso) >= start && Date.parse(iso) < start + BUCKET_MS;
    const s = summarizeWaits(done.filter((o) => inBucket(o.fired_at)).map(waitOf), target);
    buckets.push({
      start: new Date(start).toISOString(),
      arrivals: tickets.filter((o) => inBucket(o.fired_at)).length,
      drinks: drinks.filter((d) => inBucket(d.fired_at)).length,
      medianWaitSeconds: s.medianSeconds,
      p90WaitSeconds: s.p90Seconds,
    });
  }

  const quoted = unitDone.filter((o): o is (typeof unitDone)[number] & { quoted_wait_seconds: number } => o.quoted_wait_seconds !== null);
  const actual = quoted.map(waitOf);
  const avg = (xs: number[]) => (xs.length ? xs.reduce((a, b) => a + b, 0) / xs.length : null);

  // Make times per barista and category: each batch's time from its barista's previous bump (or
  // its firing) to its bump, shared among its drinks (bumpShares in src/domain/make-times.ts).
  const made = drinks
    .filter((d) => d.status === 'done' && d.done_at)
    .map((d) => ({ ...d, firedMs: Date.parse(d.fired_at), doneMs: Date.parse(d.done_at!), bumpSeq: d.bump_seq ?? null }));
  const shares = bumpShares(made);
  const unitMade = made.map((d, i) => ({ ...d, makeSeconds: shares[i] })).filter((d) => unitOrders.has(d.order_id));
  const groupBy = (key: 'bumper' | 'category') =>
    [...new Set(unitMade.map((d) => d[key] ?? '—'))].map((name) => {
      const mine = unitMade.filter((d) => (d[key] ?? '—') === name);
      const times = mine.map((d) => d.makeSeconds).filter((s): s is number => s !== null);
      return { name, drinks: mine.length, medianMakeSeconds: times.length ? median(times) : null };
    });

  // Staffing: the drinks fired in the last 30 minutes against the bar's pace over the same window
  // (the quote's: barista-time busy over drinks bumped, steadied by the default make time).
  const arrivals = drinks.filter((d) => Date.parse(d.fired_at) >= now - ARRIVALS_WINDOW_MIN * MIN).length;
  const baristas = shift?.baristasOnBar ?? location.baristasOnBar;
  const bar = await barNow(deps.db, locationId, nowDate, baristas);
  const { pace } = bar;
  const meanMake = fraction(pace.totalMs + DEFAULT_WEIGHT_DRINKS * DEFAULT_MAKE_SECONDS * 1000, 1000 * (pace.drinks + DEFAULT_WEIGHT_DRINKS));
  const meanMakeSeconds = (pace.totalMs / 1000 + DEFAULT_WEIGHT_DRINKS * DEFAULT_MAKE_SECONDS) / (pace.drinks + DEFAULT_WEIGHT_DRINKS);
  const advice = staffingAdvice({ arrivals, windowSeconds: ARRIVALS_WINDOW_MIN * 60, meanMakeSeconds: meanMake, baristas, targetSeconds: target });
  const quoteNow = (c: number) => quoteWaitSeconds({ drinksAhead: bar.drinksAhead, drinksInOrder: 1, baristas: c, pace });
  const waitNow = { drinksOnBar: bar.drinksAhead, baristas, seconds: quoteNow(baristas), withOneMoreSeconds: quoteNow(baristas + 1) };
  const modelSeconds = advice.now.stable ? advice.now.meanWaitSeconds + meanMakeSeconds : null;

  const rolling = windows[1].waits;
  const alert =
    rolling.p90Seconds !== null && rolling.p90Seconds > target
      ? `Waits are slipping: 1 ticket in 10 over the last 30 min waited longer than ${durationWords(rolling.p90Seconds)}, and the target is ${durationWords(target)}.`
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
    perBarista: groupBy('bumper').map(({ name, ...rest }) => ({ name, ...rest })),
    perCategory: groupBy('category').map(({ name, ...rest }) => ({ category: name, ...rest })),
    staffing: {
      inputs: { arrivals, windowMinutes: ARRIVALS_WINDOW_MIN, paceMinutes: PACE_WINDOW_MS / MIN, drinksTimed: pace.drinks, meanMakeSeconds, baristas },
      now: erlangView(advice.now),
      withOneMore: erlangView(advice.withOneMore),
      waitNow,
      sentence: staffingSentence(advice, waitNow, modelSeconds, meanMakeSeconds),
    },
    alert,
    beanAlerts: await pulseBeanAlerts(deps.db, locationId, nowDate, location.timeZone),
    tipsToday: pulseTips((location.tips ?? TIPS_OFF).on, (await tipsByDate(deps.db, locationId, day, day)).get(day) ?? NO_TIPS),
  };
}
