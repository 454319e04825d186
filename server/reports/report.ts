// A shift's report in four passes (a range's is summed day by day: ./days.ts), each an SQL
// aggregate except the waits: the orders by café-local hour (money), their lines by item, milk and
// hour (drinks, milk, shots, items), the ticket waits (two numeric columns: hour and seconds, for
// the percentiles) and the 20 longest.
import type { Knex } from 'knex';
import { dialectOf, rawRows } from '@server/db/dialect';
import { inHourOrder, type HourRow, type OverTargetTicket, type ReportView } from '@/domain/reports';
import type { ReportDaysView } from '@/domain/report-days';
import { median, summarizeWaits } from '@/domain/stats';
import { remakeWaste, type RemakeReason, type RemakeWaste } from '@/domain/remakes';
import { dayByDay, datesBetween, mergeDays, rangeDays } from './days';
import { localHour, localHourSql } from './local-hours';
import { tipsByDate, tipTotals } from './tips';
import { moneyView, PAID, rangeScope, shiftScope, type MoneyTotals, type Scope } from './scope';
import { CASH_OF_TOTAL, CASH_ORDER, HAS_WAIT, n, ORDER_REFUNDS, waitSeconds, type LineRow, type MoneyRow, type Sum, type WaitRow } from './sql';

const OVER_TARGET_LIMIT = 20;
const TOP_ITEMS = 10;

type Hours = Map<number, HourRow>;

export async function shiftReport(db: Knex, locationId: number, shiftId: number, now = new Date()): Promise<ReportView> {
  return buildReport(db, await shiftScope(db, locationId, shiftId, now));
}

/**
 * From and to are café-local dates (YYYY-MM-DD), both included. Summed day by day: past days'
 * partials are kept in report_days (./days.ts), today's are worked out live; `now` says which is today.
 */
export async function rangeReport(db: Knex, locationId: number, fromDate: string, toDate: string, now = new Date()): Promise<ReportView> {
  const s = await rangeScope(db, locationId, fromDate, toDate);
  const parts = await rangeDays(db, s.location, fromDate, toDate, now);
  return {
    period: s.period,
    currency: s.location.currency,
    locale: s.location.locale,
    timeZone: s.location.timeZone,
    targetSeconds: s.targetSeconds,
    ...mergeDays(parts, datesBetween(fromDate, toDate), s.targetSeconds),
    tips: await tipTotals(db, s.where, s.bindings),
    remakes: await remakeTotals(db, s),
  };
}

/**
 * The range from..to day by day: a row per café-local date (a date without orders as zeros), each
 * what the range report of that date alone answers, and the whole range's figures. One reading of
 * the days' partials (./days.ts) serves every row and the total.
 */
export async function reportDays(db: Knex, locationId: number, fromDate: string, toDate: string, now = new Date()): Promise<ReportDaysView> {
  const s = await rangeScope(db, locationId, fromDate, toDate);
  const parts = await rangeDays(db, s.location, fromDate, toDate, now);
  return {
    from: fromDate,
    to: toDate,
    currency: s.location.currency,
    locale: s.location.locale,
    timeZone: s.location.timeZone,
    targetSeconds: s.targetSeconds,
    ...dayByDay(parts, datesBetween(fromDate, toDate), s.targetSeconds, await tipsByDate(db, locationId, fromDate, toDate)),
  };
}

const hourSql = (db: Knex, s: Scope) => localHourSql(dialectOf(db), 'o.created_at', s.spanMs[0], s.spanMs[1], s.location.timeZone);

function hourRow(hours: Hours, hour: number): HourRow {
  let row = hours.get(hour);
  if (!row) hours.set(hour, (row = { hour, orders: 0, drinks: 0, cents: 0, medianWaitSeconds: null }));
  return row;
}

/** Paid orders by hour: counts and money, summed again here over at most 24 rows. */
async function moneyByHour(db: Knex, s: Scope, hours: Hours) {
  const hour = hourSql(db, s);
  const rows = rawRows<MoneyRow>(
    await db.raw(
      `SELECT ${hour.sql} AS hour, COUNT(*) AS orders, SUM(o.total_cents) AS gross, SUM(o.tax_cents) AS tax,
         SUM(o.discount_cents) AS discount, SUM(${ORDER_REFUNDS}) AS refunds,
         SUM(CASE WHEN ${CASH_ORDER} THEN 1 ELSE 0 END) AS cash_orders, SUM(${CASH_OF_TOTAL}) AS cash_cents
       FROM orders o WHERE ${s.where} AND ${PAID} GROUP BY 1`,
      [...hour.bindings, ...s.bindings],
    ),
  );
  const t: MoneyTotals = { orders: 0, gross: 0, tax: 0, discount: 0, refunds: 0, cashOrders: 0, cashCents: 0 };
  for (const r of rows) {
    Object.assign(hourRow(hours, n(r.hour)), { orders: n(r.orders), cents: n(r.gross) });
    t.orders += n(r.orders);
    t.gross += n(r.gross);
    t.tax += n(r.tax);
    t.discount += n(r.discount);
    t.refunds += n(r.refunds);
    t.cashOrders += n(r.cash_orders);
    t.cashCents += n(r.cash_cents);
  }
  return moneyView(t);
}

/** Lines by item, milk, station and hour: what was sold (paid orders) and what the bar made (drinks done). */
async function lineTotals(db: Knex, s: Scope, hours: Hours) {
  const hour = hourSql(db, s);
  const made = `i.station = 'bar' AND i.status = 'done'`;
  const rows = rawRows<LineRow>(
    await db.raw(
      `SELECT i.item_name AS item, i.milk_name AS milk, i.station AS station, ${hour.sql} AS hour,
         SUM(CASE WHEN ${PAID} AND i.remake_of IS NULL THEN 1 ELSE 0 END) AS sold, SUM(CASE WHEN ${PAID} THEN i.price_cents ELSE 0 END) AS cents,
         SUM(CASE WHEN ${made} THEN i.milk_ml ELSE 0 END) AS milk_ml,
         SUM(CASE WHEN ${made} THEN i.shots ELSE 0 END) AS shots,
         SUM(CASE WHEN ${made} THEN i.dose_dg ELSE 0 END) AS dose_dg
       FROM orders o JOIN order_items i ON i.order_id = o.id
       WHERE ${s.where}
       GROUP BY 1, 2, 3, 4`,
      [...hour.bindings, ...s.bindings],
    ),
  );
  const items = new Map<string, { item: string; count: number; cents: number }>();
  const milks = new Map<string, number>();
  const out = { drinks: 0, shotsPulled: 0, coffeeUsedDg: 0 };
  for (const r of rows) {
    if (r.station === 'bar' && n(r.sold) > 0) {
      out.drinks += n(r.sold);
      hourRow(hours, n(r.hour)).drinks += n(r.sold);
    }
    out.shotsPulled += n(r.shots);
    out.coffeeUsedDg += n(r.dose_dg);
    if (r.milk && n(r.milk_ml) > 0) milks.set(r.milk, (milks.get(r.milk) ?? 0) + n(r.milk_ml));
    if (n(r.sold) > 0) {
      const it = items.get(r.item) ?? { item: r.item, count: 0, cents: 0 };
      it.count += n(r.sold);
      it.cents += n(r.cents);
      items.set(r.item, it);
    }
  }
  const topItems = [...items.values()].sort((a, b) => b.count - a.count || b.cents - a.cents || a.item.localeCompare(b.item)).slice(0, TOP_ITEMS);
  const milkUsedMl = [...milks].map(([milk, ml]) => ({ milk, ml })).sort((a, b) => b.ml - a.ml || a.milk.localeCompare(b.milk));
  return { ...out, topItems, milkUsedMl };
}

/** Every timed ticket's wait (and hour, for the hourly medians); only these rows come into JS. */
async function waitTimes(db: Knex, s: Scope, hours: Hours): Promise<number[]> {
  const hour = hourSql(db, s);
  const rows: { h: number; w: number }[] = rawRows(
    await db.raw(`SELECT ${hour.sql} AS h, ${waitSeconds(dialectOf(db))} AS w FROM orders o WHERE ${s.where} AND ${HAS_WAIT}`, [
      ...hour.bindings,
      ...s.bindings,
    ]),
  );
  const all = new Array<number>(rows.length);
  const perHour = new Map<number, number[]>();
  rows.forEach((r, i) => {
    all[i] = r.w;
    const list = perHour.get(r.h) ?? [];
    list.push(r.w);
    perHour.set(r.h, list);
  });
  // Hours of paid orders only: a refunded-in-full ticket's hour still shows through its own order.
  for (const [h, list] of perHour) if (hours.has(h)) hourRow(hours, h).medianWaitSeconds = median(list);
  return all;
}

async function overTarget(db: Knex, s: Scope): Promise<OverTargetTicket[]> {
  const rows = rawRows<WaitRow>(
    await db.raw(
      `SELECT o.id, o.business_date, o.number, o.customer_name, ${waitSeconds(dialectOf(db))} AS w
       FROM orders o WHERE ${s.where} AND ${HAS_WAIT} AND ${waitSeconds(dialectOf(db))} > ?
       ORDER BY w DESC, o.id LIMIT ${OVER_TARGET_LIMIT}`,
      [...s.bindings, s.targetSeconds],
    ),
  );
  return rows.map((r) => ({ orderId: r.id, businessDate: r.business_date, number: r.number, customerName: r.customer_name, waitSeconds: Number(r.w) }));
}

/**
 * Remakes as waste, per reason: how many, and the coffee and cold milk of the drinks they
 * replaced (those went in the bin; the remake itself is counted in the coffee and milk used).
 * Read from the orders directly, as the tips are: a remake is a line of an order of the period.
 */
async function remakeTotals(db: Knex, s: Scope): Promise<RemakeWaste> {
  const rows = rawRows<{ reason: RemakeReason; count: Sum; dose: Sum; milk: Sum }>(
    await db.raw(
      `SELECT r.remake_reason AS reason, COUNT(*) AS count, SUM(w.dose_dg) AS dose, SUM(w.milk_ml) AS milk
       FROM orders o JOIN order_items r ON r.order_id = o.id JOIN order_items w ON w.id = r.remake_of
       WHERE ${s.where} GROUP BY r.remake_reason`,
      s.bindings,
    ),
  );
  return remakeWaste(rows.map((r) => ({ reason: r.reason, count: n(r.count), doseDg: n(r.dose), milkMl: n(r.milk) })));
}

async function buildReport(db: Knex, s: Scope): Promise<ReportView> {
  const hours: Hours = new Map();
  // one connection: these run one after another, and the order fills `hours` before the waits read it
  const money = await moneyByHour(db, s, hours);
  const lines = await lineTotals(db, s, hours);
  const waits = await waitTimes(db, s, hours);
  const over = await overTarget(db, s);
  return {
    period: s.period,
    currency: s.location.currency,
    locale: s.location.locale,
    timeZone: s.location.timeZone,
    targetSeconds: s.targetSeconds,
    ...money,
    tips: await tipTotals(db, s.where, s.bindings),
    remakes: await remakeTotals(db, s),
    drinks: lines.drinks,
    waits: summarizeWaits(waits, s.targetSeconds),
    overTarget: over,
    milkUsedMl: lines.milkUsedMl,
    shotsPulled: lines.shotsPulled,
    coffeeUsedDg: lines.coffeeUsedDg,
    topItems: lines.topItems,
    // a shift's hours in the order they were worked, whatever the calendar day (22, 23, 0, 1…)
    hourly: inHourOrder(
      [...hours.values()].filter((h) => h.orders > 0),
      s.period.shift ? localHour(Date.parse(s.period.shift.openedAt), s.location.timeZone) : 0,
    ),
  };
}
