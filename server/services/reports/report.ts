// A period's report, from SQL aggregates: one pass over the orders for money, one over their
// lines for drinks, milk, shots and items, the hours grouped in SQL, and only the wait times
// (one column) brought into JS for the percentiles.
import type { Knex } from 'knex';
import type { HourRow, OverTargetTicket, ReportView } from '../../../src/domain/reports';
import { summarizeWaits } from '../../../src/domain/stats';
import { localHourSql } from './local-hours';
import { PAID, rangeScope, shiftScope, type Scope } from './scope';
import { BAR_DRINKS, HAS_WAIT, WAIT_SECONDS, n } from './sql';

const OVER_TARGET_LIMIT = 20;
const TOP_ITEMS = 10;

export async function shiftReport(db: Knex, locationId: number, shiftId: number, now = new Date()): Promise<ReportView> {
  return buildReport(db, await shiftScope(db, locationId, shiftId, now));
}

/** From and to are café-local dates (YYYY-MM-DD), both included. */
export async function rangeReport(db: Knex, locationId: number, fromDate: string, toDate: string): Promise<ReportView> {
  return buildReport(db, await rangeScope(db, locationId, fromDate, toDate));
}

async function moneyTotals(db: Knex, s: Scope) {
  const method = (m: 'cash' | 'card') =>
    `SUM(CASE WHEN o.payment_method = '${m}' THEN 1 ELSE 0 END) AS ${m}_orders, ` +
    `SUM(CASE WHEN o.payment_method = '${m}' THEN o.total_cents ELSE 0 END) AS ${m}_cents`;
  const [row] = await db.raw(
    `SELECT COUNT(*) AS orders, SUM(o.total_cents) AS gross, SUM(o.tax_cents) AS tax, SUM(o.discount_cents) AS discount,
       SUM(o.refunded_cents) AS refunds, ${method('cash')}, ${method('card')}
     FROM orders o WHERE ${s.where} AND ${PAID}`,
    s.bindings,
  );
  const gross = n(row.gross);
  const refunds = n(row.refunds);
  return {
    orders: n(row.orders),
    grossCents: gross,
    taxCents: n(row.tax),
    discountCents: n(row.discount),
    refundsCents: refunds,
    netCents: gross - refunds,
    paymentMix: {
      cash: { orders: n(row.cash_orders), cents: n(row.cash_cents) },
      card: { orders: n(row.card_orders), cents: n(row.card_cents) },
    },
  };
}

/** Lines grouped by item and milk: sold lines of paid orders, and what the bar made (drinks done). */
async function lineTotals(db: Knex, s: Scope) {
  const made = `i.station = 'bar' AND i.status = 'done'`;
  const rows: Record<string, any>[] = await db.raw(
    `SELECT i.item_name AS item, i.milk_name AS milk, i.station AS station,
       SUM(CASE WHEN ${PAID} THEN 1 ELSE 0 END) AS sold,
       SUM(CASE WHEN ${PAID} THEN i.price_cents ELSE 0 END) AS cents,
       SUM(CASE WHEN ${made} THEN i.milk_ml ELSE 0 END) AS milk_ml,
       SUM(CASE WHEN ${made} THEN i.shots ELSE 0 END) AS shots,
       SUM(CASE WHEN ${made} THEN i.dose_dg ELSE 0 END) AS dose_dg
     FROM orders o JOIN order_items i ON i.order_id = o.id
     WHERE ${s.where}
     GROUP BY i.item_name, i.milk_name, i.station`,
    s.bindings,
  );
  const items = new Map<string, { item: string; count: number; cents: number }>();
  const milks = new Map<string, number>();
  let drinks = 0;
  let shotsPulled = 0;
  let coffeeUsedDg = 0;
  for (const r of rows) {
    if (r.station === 'bar') drinks += n(r.sold);
    shotsPulled += n(r.shots);
    coffeeUsedDg += n(r.dose_dg);
    if (r.milk && n(r.milk_ml) > 0) milks.set(r.milk, (milks.get(r.milk) ?? 0) + n(r.milk_ml));
    if (n(r.sold) > 0) {
      const it = items.get(r.item) ?? { item: r.item, count: 0, cents: 0 };
      it.count += n(r.sold);
      it.cents += n(r.cents);
      items.set(r.item, it);
    }
  }
  const topItems = [...items.values()]
    .sort((a, b) => b.count - a.count || b.cents - a.cents || a.item.localeCompare(b.item))
    .slice(0, TOP_ITEMS);
  const milkUsedMl = [...milks].map(([milk, ml]) => ({ milk, ml })).sort((a, b) => b.ml - a.ml || a.milk.localeCompare(b.milk));
  return { drinks, shotsPulled, coffeeUsedDg, topItems, milkUsedMl };
}

async function waitTimes(db: Knex, s: Scope): Promise<number[]> {
  const rows: { w: number }[] = await db.raw(`SELECT ${WAIT_SECONDS} AS w FROM orders o WHERE ${s.where} AND ${HAS_WAIT}`, s.bindings);
  return rows.map((r) => Number(r.w));
}

async function overTarget(db: Knex, s: Scope): Promise<OverTargetTicket[]> {
  const rows: Record<string, any>[] = await db.raw(
    `SELECT o.id, o.business_date, o.number, o.customer_name, ${WAIT_SECONDS} AS w
     FROM orders o WHERE ${s.where} AND ${HAS_WAIT} AND ${WAIT_SECONDS} > ?
     ORDER BY w DESC, o.id LIMIT ${OVER_TARGET_LIMIT}`,
    [...s.bindings, s.targetSeconds],
  );
  return rows.map((r) => ({ orderId: r.id, businessDate: r.business_date, number: r.number, customerName: r.customer_name, waitSeconds: Number(r.w) }));
}

/** Paid orders by the café-local hour they were taken, with each hour's median wait (type 7). */
async function hourly(db: Knex, s: Scope): Promise<HourRow[]> {
  const [span] = await db.raw(`SELECT MIN(o.created_at) AS lo, MAX(o.created_at) AS hi FROM orders o WHERE ${s.where}`, s.bindings);
  if (!span?.lo) return [];
  const hour = localHourSql('o.created_at', span.lo, span.hi, s.location.timeZone);
  const counts: Record<string, any>[] = await db.raw(
    `SELECT ${hour.sql} AS hour, COUNT(*) AS orders, SUM(${BAR_DRINKS}) AS drinks, SUM(o.total_cents) AS cents
     FROM orders o WHERE ${s.where} AND ${PAID} GROUP BY 1`,
    [...hour.bindings, ...s.bindings],
  );
  // For n waits in an hour, the type-7 median is the middle one, or the mean of the two middle ones.
  const medians: Record<string, any>[] = await db.raw(
    `WITH w AS (SELECT ${hour.sql} AS hour, ${WAIT_SECONDS} AS wait FROM orders o WHERE ${s.where} AND ${HAS_WAIT}),
       r AS (SELECT hour, wait, ROW_NUMBER() OVER (PARTITION BY hour ORDER BY wait) AS rn, COUNT(*) OVER (PARTITION BY hour) AS c FROM w)
     SELECT hour, AVG(wait) AS median FROM r WHERE rn IN ((c + 1) / 2, (c + 2) / 2) GROUP BY hour`,
    [...hour.bindings, ...s.bindings],
  );
  const medianOf = new Map(medians.map((m) => [n(m.hour), Number(m.median)]));
  return counts
    .map((c) => ({ hour: n(c.hour), orders: n(c.orders), drinks: n(c.drinks), cents: n(c.cents), medianWaitSeconds: medianOf.get(n(c.hour)) ?? null }))
    .sort((a, b) => a.hour - b.hour);
}

async function buildReport(db: Knex, s: Scope): Promise<ReportView> {
  const [money, lines, waits, over, hours] = await Promise.all([
    moneyTotals(db, s),
    lineTotals(db, s),
    waitTimes(db, s),
    overTarget(db, s),
    hourly(db, s),
  ]);
  return {
    period: s.period,
    currency: s.location.currency,
    locale: s.location.locale,
    timeZone: s.location.timeZone,
    targetSeconds: s.targetSeconds,
    ...money,
    drinks: lines.drinks,
    waits: summarizeWaits(waits, s.targetSeconds),
    overTarget: over,
    milkUsedMl: lines.milkUsedMl,
    shotsPulled: lines.shotsPulled,
    coffeeUsedDg: lines.coffeeUsedDg,
    topItems: lines.topItems,
    hourly: hours,
  };
}
