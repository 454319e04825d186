// The range report by café day. Each day's share of the report (a partial: sums, counts, the
// payment mix, milk, shots, coffee, items, hourly partials, the raw waits and the longest tickets)
// is worked out in SQL for a run of days at once; a PAST day's partial is kept in report_days and
// read back next time, today's (and any later date's) is always worked out live. The partials are
// merged exactly as the single-pass report sums its rows, so the answer is the same to the bit:
// the waits are concatenated in the order one pass over the range reads them (date, then ticket
// number) before the percentiles and the mean are taken.
//
// A day's row is deleted by triggers (migrations/20261201000700_report_indexes.ts) whenever one of
// its orders or order lines is inserted, changed or deleted, in the same transaction; it is
// recomputed the next time a range needs it.
import type { Knex } from 'knex';
import { dialectOf, lockReportDays, rawRows } from '@server/db/dialect';
import { json } from '@server/db/rows';
import { NO_TIPS, sumTips, type HourRow, type OverTargetTicket, type ReportView, type TipTotals } from '@/domain/reports';
import { dayFigures, type ReportDaysView } from '@/domain/report-days';
import { median, summarizeWaits } from '@/domain/stats';
import { businessDate } from '@/domain/business-date';
import { localHourSql } from './local-hours';
import { moneyView, PAID, type ReportLocation } from './scope';
import { CASH_OF_TOTAL, CASH_ORDER, HAS_WAIT, n, ORDER_REFUNDS, waitSeconds, type LineRow, type MoneyRow, type WaitRow } from './sql';

const OVER_TARGET_LIMIT = 20;
const TOP_ITEMS = 10;
const DAY_MS = 86_400_000;
/** Bump when the partial's shape or meaning changes: older rows are then recomputed. */
const PAYLOAD_VERSION = 1;

/** One café day's share of a range report. Arrays, not objects, to keep the stored JSON small. */
export interface DayPartial {
  v: number;
  /** the zone the hours were worked out in */
  tz: string;
  /** per café-local hour with paid orders or bar drinks sold: [hour, orders, gross, tax, discount, refunds, cashOrders, cashCents, drinks] */
  hours: number[][];
  shots: number;
  doseDg: number;
  /** [milk, ml] for milk the bar used */
  milk: [string, number][];
  /** [item, lines sold, cents] */
  items: [string, number, number][];
  /** every timed ticket's wait, in ticket-number order */
  waits: number[];
  /** the café-local hour of each wait, run-length coded: [hour, count, hour, count, …] */
  waitHours: number[];
  /** the day's longest waits whatever the target, longest first: [orderId, number, customer, wait] */
  longest: [number, number, string, number][];
}

export const emptyPartial = (tz: string): DayPartial => ({
  v: PAYLOAD_VERSION,
  tz,
  hours: [],
  shots: 0,
  doseDg: 0,
  milk: [],
  items: [],
  waits: [],
  waitHours: [],
  longest: [],
});

/** Every date from `from` to `to`, both included (YYYY-MM-DD, café-local). */
export function datesBetween(from: string, to: string): string[] {
  const out: string[] = [];
  for (let t = Date.parse(`${from}T00:00:00Z`), end = Date.parse(`${to}T00:00:00Z`); t <= end; t += DAY_MS) {
    out.push(new Date(t).toISOString().slice(0, 10));
  }
  return out;
}

/** The partials of the days from..to, worked out from the orders in four SQL passes. */
export async function computeDays(db: Knex, location: ReportLocation, from: string, to: string): Promise<Map<string, DayPartial>> {
  const tz = location.timeZone;
  const days = new Map<string, DayPartial>(datesBetween(from, to).map((d) => [d, emptyPartial(tz)]));
  const day = (date: string) => days.get(date)!;
  const where = 'o.location_id = ? AND o.business_date BETWEEN ? AND ?';
  const bindings = [location.id, from, to];
  // a café-local date starts within 14 hours of the same date's UTC midnight
  const hour = localHourSql(dialectOf(db), 'o.created_at', Date.parse(`${from}T00:00:00Z`) - DAY_MS, Date.parse(`${to}T00:00:00Z`) + 2 * DAY_MS, tz);

  const hourRows = new Map<string, Map<number, number[]>>();
  const hourOf = (date: string, h: number) => {
    let m = hourRows.get(date);
    if (!m) hourRows.set(date, (m = new Map()));
    let row = m.get(h);
    if (!row) m.set(h, (row = [h, 0, 0, 0, 0, 0, 0, 0, 0]));
    return row;
  };

  const money = rawRows<MoneyRow & { d: string }>(
    await db.raw(
      `SELECT o.business_date AS d, ${hour.sql} AS hour, COUNT(*) AS orders, SUM(o.total_cents) AS gross, SUM(o.tax_cents) AS tax,
         SUM(o.discount_cents) AS discount, SUM(${ORDER_REFUNDS}) AS refunds,
         SUM(CASE WHEN ${CASH_ORDER} THEN 1 ELSE 0 END) AS cash_orders, SUM(${CASH_OF_TOTAL}) AS cash_cents
       FROM orders o WHERE ${where} AND ${PAID} GROUP BY 1, 2`,
      [...hour.bindings, ...bindings],
    ),
  );
  for (const r of money) {
    const row = hourOf(r.d, n(r.hour));
    row[1] = n(r.orders);
    row[2] = n(r.gross);
    row[3] = n(r.tax);
    row[4] = n(r.discount);
    row[5] = n(r.refunds);
    row[6] = n(r.cash_orders);
    row[7] = n(r.cash_cents);
  }

  const made = `i.station = 'bar' AND i.status = 'done'`;
  const lines = rawRows<LineRow & { d: string }>(
    await db.raw(
      `SELECT o.business_date AS d, i.item_name AS item, i.milk_name AS milk, i.station AS station, ${hour.sql} AS hour,
         SUM(CASE WHEN ${PAID} AND i.remake_of IS NULL THEN 1 ELSE 0 END) AS sold, SUM(CASE WHEN ${PAID} THEN i.price_cents ELSE 0 END) AS cents,
         SUM(CASE WHEN ${made} THEN i.milk_ml ELSE 0 END) AS milk_ml,
         SUM(CASE WHEN ${made} THEN i.shots ELSE 0 END) AS shots,
         SUM(CASE WHEN ${made} THEN i.dose_dg ELSE 0 END) AS dose_dg
       FROM orders o JOIN order_items i ON i.order_id = o.id
       WHERE ${where}
       GROUP BY 1, 2, 3, 4, 5`,
      [...hour.bindings, ...bindings],
    ),
  );
  const milks = new Map<string, Map<string, number>>();
  const items = new Map<string, Map<string, [string, number, number]>>();
  for (const r of lines) {
    const p = day(r.d);
    if (r.station === 'bar' && n(r.sold) > 0) hourOf(r.d, n(r.hour))[8] += n(r.sold);
    p.shots += n(r.shots);
    p.doseDg += n(r.dose_dg);
    if (r.milk && n(r.milk_ml) > 0) {
      const m = milks.get(r.d) ?? new Map<string, number>();
      m.set(r.milk, (m.get(r.milk) ?? 0) + n(r.milk_ml));
      milks.set(r.d, m);
    }
    if (n(r.sold) > 0) {
      const m = items.get(r.d) ?? new Map<string, [string, number, number]>();
      const it = m.get(r.item) ?? [r.item, 0, 0];
      it[1] += n(r.sold);
      it[2] += n(r.cents);
      m.set(r.item, it);
      items.set(r.d, m);
    }
  }

  // date, then ticket number: the order one pass over the whole range reads them in
  const waits: { d: string; h: number; w: number }[] = rawRows(
    await db.raw(
      `SELECT o.business_date AS d, ${hour.sql} AS h, ${waitSeconds(dialectOf(db))} AS w FROM orders o WHERE ${where} AND ${HAS_WAIT}
       ORDER BY o.business_date, o.number`,
      [...hour.bindings, ...bindings],
    ),
  );
  for (const r of waits) {
    const p = day(r.d);
    p.waits.push(r.w);
    const last = p.waitHours.length - 2;
    if (last >= 0 && p.waitHours[last] === r.h) p.waitHours[last + 1]++;
    else p.waitHours.push(r.h, 1);
  }

  const longest = rawRows<Omit<WaitRow, 'business_date'> & { d: string }>(
    await db.raw(
      `SELECT d, id, number, customer_name, w FROM (
         SELECT o.business_date AS d, o.id, o.number, o.customer_name, ${waitSeconds(dialectOf(db))} AS w,
           ROW_NUMBER() OVER (PARTITION BY o.business_date ORDER BY ${waitSeconds(dialectOf(db))} DESC, o.id) AS rank
         FROM orders o WHERE ${where} AND ${HAS_WAIT}
       ) ranked WHERE rank <= ${OVER_TARGET_LIMIT} ORDER BY d, rank`,
      bindings,
    ),
  );
  for (const r of longest) day(r.d).longest.push([r.id, r.number, r.customer_name, Number(r.w)]);

  for (const [date, p] of days) {
    p.hours = [...(hourRows.get(date)?.values() ?? [])].sort((a, b) => a[0] - b[0]);
    p.milk = [...(milks.get(date) ?? [])];
    p.items = [...(items.get(date)?.values() ?? [])];
  }
  return days;
}

/**
 * The partials of from..to: past days from report_days, computed and stored when missing; today
 * and later dates live. Run in one transaction, so no command lands between a day's reading and
 * its storing (a stored row is never older than the orders it sums).
 */
export async function rangeDays(db: Knex, location: ReportLocation, from: string, to: string, now: Date): Promise<DayPartial[]> {
  const today = businessDate(now, location.timeZone);
  return db.transaction(async (trx) => {
    const dates = datesBetween(from, to);
    const past = dates.filter((d) => d < today);
    const parts = new Map<string, DayPartial>();
    if (past.length) {
      const rows: { business_date: string; payload: unknown }[] = await trx('report_days')
        .where({ location_id: location.id })
        .whereBetween('business_date', [past[0], past[past.length - 1]])
        .select('business_date', 'payload');
      for (const r of rows) {
        const p = json<DayPartial | null>(r.payload, null);
        if (p && p.v === PAYLOAD_VERSION && p.tz === location.timeZone) parts.set(r.business_date, p);
      }
      const missing = past.filter((d) => !parts.has(d));
      await lockReportDays(trx, location.id, missing); // no change to their orders slips in meanwhile
      const computedAt = now.toISOString();
      for (const [a, b] of runs(missing)) {
        const computed = await computeDays(trx, location, a, b);
        const rows = [...computed].map(([date, p]) => ({
          location_id: location.id,
          business_date: date,
          computed_at: computedAt,
          payload: JSON.stringify(p),
        }));
        for (let i = 0; i < rows.length; i += 100) {
          await trx('report_days')
            .insert(rows.slice(i, i + 100))
            .onConflict(['location_id', 'business_date'])
            .merge();
        }
        for (const [date, p] of computed) parts.set(date, p);
      }
    }
    const live = dates.filter((d) => d >= today);
    if (live.length) for (const [date, p] of await computeDays(trx, location, live[0], live[live.length - 1])) parts.set(date, p);
    return dates.map((d) => parts.get(d)!);
  });
}

/** Sorted dates → [first, last] of each run of consecutive days. */
function runs(dates: string[]): [string, string][] {
  const out: [string, string][] = [];
  for (const d of dates) {
    const last = out[out.length - 1];
    if (last && Date.parse(`${d}T00:00:00Z`) - Date.parse(`${last[1]}T00:00:00Z`) === DAY_MS) last[1] = d;
    else out.push([d, d]);
  }
  return out;
}

/** The partials (in date order) summed into the report, as the single-pass report sums its rows. */
export function mergeDays(
  parts: DayPartial[],
  dates: string[],
  targetSeconds: number,
): Omit<ReportView, 'period' | 'currency' | 'locale' | 'timeZone' | 'targetSeconds' | 'tips' | 'remakes'> {
  const t = { orders: 0, gross: 0, tax: 0, discount: 0, refunds: 0, cashOrders: 0, cashCents: 0, drinks: 0, shots: 0, dose: 0 };
  const hours = new Map<number, HourRow>();
  const milks = new Map<string, number>();
  const items = new Map<string, { item: string; count: number; cents: number }>();
  const perHour = new Map<number, number[]>();
  let count = 0;
  for (const p of parts) count += p.waits.length;
  const all = new Array<number>(count);
  let k = 0;
  const over: OverTargetTicket[] = [];
  parts.forEach((p, di) => {
    for (const [h, orders, gross, tax, discount, refunds, cashOrders, cashCents, drinks] of p.hours) {
      let row = hours.get(h);
      if (!row) hours.set(h, (row = { hour: h, orders: 0, drinks: 0, cents: 0, medianWaitSeconds: null }));
      row.orders += orders;
      row.cents += gross;
      row.drinks += drinks;
      t.orders += orders;
      t.gross += gross;
      t.tax += tax;
      t.discount += discount;
      t.refunds += refunds;
      t.cashOrders += cashOrders;
      t.cashCents += cashCents;
      t.drinks += drinks;
    }
    t.shots += p.shots;
    t.dose += p.doseDg;
    for (const [milk, ml] of p.milk) milks.set(milk, (milks.get(milk) ?? 0) + ml);
    for (const [item, c, cents] of p.items) {
      const it = items.get(item) ?? { item, count: 0, cents: 0 };
      it.count += c;
      it.cents += cents;
      items.set(item, it);
    }
    let w = 0;
    for (let r = 0; r < p.waitHours.length; r += 2) {
      const h = p.waitHours[r];
      let list = perHour.get(h);
      if (!list) perHour.set(h, (list = []));
      for (let end = w + p.waitHours[r + 1]; w < end; w++) {
        list.push(p.waits[w]);
        all[k++] = p.waits[w];
      }
    }
    for (const [orderId, number, customerName, waitSeconds] of p.longest) {
      if (waitSeconds > targetSeconds) over.push({ orderId, businessDate: dates[di], number, customerName, waitSeconds });
    }
  });
  // Hours of paid orders only: a refunded-in-full ticket's hour still shows through its own order.
  for (const [h, list] of perHour) {
    const row = hours.get(h);
    if (row && row.orders > 0) row.medianWaitSeconds = median(list);
  }
  over.sort((a, b) => b.waitSeconds - a.waitSeconds || a.orderId - b.orderId);
  return {
    ...moneyView(t),
    drinks: t.drinks,
    waits: summarizeWaits(all, targetSeconds),
    overTarget: over.slice(0, OVER_TARGET_LIMIT),
    milkUsedMl: [...milks].map(([milk, ml]) => ({ milk, ml })).sort((a, b) => b.ml - a.ml || a.milk.localeCompare(b.milk)),
    shotsPulled: t.shots,
    coffeeUsedDg: t.dose,
    topItems: [...items.values()].sort((a, b) => b.count - a.count || b.cents - a.cents || a.item.localeCompare(b.item)).slice(0, TOP_ITEMS),
    hourly: [...hours.values()].filter((h) => h.orders > 0).sort((a, b) => a.hour - b.hour),
  };
}

/**
 * Day by day from the partials (in date order): each date's row merged from its partial alone, as
 * that date's own range report is, and the total merged from all of them, as the range's report
 * is (a median of the whole range, never one of the days' medians). Tips come by date from the
 * orders (./tips.ts), a date without any as none; the total's are the days' added up.
 */
export function dayByDay(
  parts: DayPartial[],
  dates: string[],
  targetSeconds: number,
  tips = new Map<string, TipTotals>(),
): Pick<ReportDaysView, 'days' | 'total'> {
  const tipsOf = (date: string) => tips.get(date) ?? NO_TIPS;
  return {
    days: dates.map((date, i) => ({ date, ...dayFigures({ ...mergeDays([parts[i]], [date], targetSeconds), tips: tipsOf(date) }) })),
    total: dayFigures({ ...mergeDays(parts, dates, targetSeconds), tips: sumTips(dates.map(tipsOf)) }),
  };
}
