// Which orders a report covers: a shift's (orders.shift_id) or a range of café-local dates
// (orders.business_date), always within one café. Both filters ride on an index.
import type { Knex } from 'knex';
import type { ReportPeriod } from '@/domain/reports';
import { notFound } from '@server/domain-errors';
import { businessDate } from '@/domain/business-date';
import { expectedCash } from '@server/shifts/shifts';

export interface ReportLocation {
  id: number;
  name: string;
  currency: string;
  locale: string;
  timeZone: string;
  waitTargetSeconds: number;
}

export interface Scope {
  period: ReportPeriod;
  location: ReportLocation;
  targetSeconds: number;
  /** instants (ms) every order of the period was taken between, with a day to spare either side */
  spanMs: [number, number];
  /** SQL condition on the orders table aliased `o`, with its bindings */
  where: string;
  bindings: (string | number)[];
}

/** Orders whose money counts: paid, or paid and then refunded in part or in full. */
const DAY_MS = 86_400_000;

export const PAID = `o.payment_status IN ('paid', 'refunded')`;

export async function loadReportLocation(db: Knex, locationId: number): Promise<ReportLocation> {
  const l = await db('locations').where({ id: locationId }).first();
  if (!l) throw notFound('Location');
  return {
    id: l.id,
    name: l.name,
    currency: l.currency,
    locale: l.locale,
    timeZone: l.time_zone,
    waitTargetSeconds: l.wait_target_seconds,
  };
}

export async function shiftScope(db: Knex, locationId: number, shiftId: number, now: Date): Promise<Scope> {
  const s = await db('shifts')
    .leftJoin('users as o', 'o.id', 'shifts.opened_by')
    .leftJoin('users as c', 'c.id', 'shifts.closed_by')
    .where({ 'shifts.id': shiftId, 'shifts.location_id': locationId })
    .first('shifts.*', 'o.name as opened_by_name', 'c.name as closed_by_name');
  if (!s) throw notFound('Shift');
  const expected = s.closed_at && s.expected_cash_cents !== null ? s.expected_cash_cents : await expectedCash(db, s.id);
  const counted: number | null = s.closed_at ? s.counted_cash_cents : null;
  const location = await loadReportLocation(db, locationId);
  const day = (iso: string) => businessDate(new Date(iso), location.timeZone);
  return {
    period: {
      kind: 'shift',
      from: day(s.opened_at),
      to: s.closed_at ? day(s.closed_at) : businessDate(now, location.timeZone),
      shift: {
        id: s.id,
        openedAt: s.opened_at,
        closedAt: s.closed_at ?? null,
        waitTargetSeconds: s.wait_target_seconds,
        cash: {
          openedBy: s.opened_by_name ?? null,
          closedBy: s.closed_by_name ?? null,
          openingFloatCents: s.opening_float_cents,
          expectedCashCents: expected,
          countedCashCents: counted,
          differenceCents: counted === null ? null : counted - expected,
          closeNote: s.close_note ?? null,
          openTicketsAtClose: s.open_tickets_at_close ?? null,
          oldestOpenWaitSecondsAtClose: s.oldest_open_wait_seconds_at_close ?? null,
        },
      },
    },
    location,
    targetSeconds: s.wait_target_seconds,
    spanMs: [Date.parse(s.opened_at) - DAY_MS, (s.closed_at ? Date.parse(s.closed_at) : now.getTime()) + DAY_MS],
    where: 'o.location_id = ? AND o.shift_id = ?',
    bindings: [locationId, shiftId],
  };
}

export async function rangeScope(db: Knex, locationId: number, from: string, to: string): Promise<Scope> {
  const location = await loadReportLocation(db, locationId);
  return {
    period: { kind: 'range', from, to },
    location,
    targetSeconds: location.waitTargetSeconds,
    // a café-local date starts within 14 hours of the same date's UTC midnight
    spanMs: [Date.parse(`${from}T00:00:00Z`) - DAY_MS, Date.parse(`${to}T00:00:00Z`) + 2 * DAY_MS],
    where: 'o.location_id = ? AND o.business_date BETWEEN ? AND ?',
    bindings: [locationId, from, to],
  };
}

/** Running money totals of paid orders, as both the live report and the day rollups add them up. */
export interface MoneyTotals {
  orders: number;
  gross: number;
  tax: number;
  discount: number;
  refunds: number;
  cashOrders: number;
  cashCents: number;
}

/** The report's money figures from those totals: net is gross less refunds; card is the rest of gross. */
export function moneyView(t: MoneyTotals) {
  return {
    orders: t.orders,
    grossCents: t.gross,
    taxCents: t.tax,
    discountCents: t.discount,
    refundsCents: t.refunds,
    netCents: t.gross - t.refunds,
    paymentMix: {
      cash: { orders: t.cashOrders, cents: t.cashCents },
      card: { orders: t.orders - t.cashOrders, cents: t.gross - t.cashCents },
    },
  };
}
