// SQL pieces shared by the report and the ticket history (orders aliased `o`).
import type { Station } from '@/domain/types';
import { type Dialect, secondsBetweenSql } from '@server/db/dialect';

/** Fired → ready in seconds, to the millisecond (timestamps are ISO strings). */
export const waitSeconds = (d: Dialect) => secondsBetweenSql(d, 'o.fired_at', 'o.ready_at');

export const HAS_BAR_DRINK = `EXISTS (SELECT 1 FROM order_items b WHERE b.order_id = o.id AND b.station = 'bar')`;

export const BAR_DRINKS = `(SELECT COUNT(*) FROM order_items b WHERE b.order_id = o.id AND b.station = 'bar')`;

/** A ticket whose wait counts: made at the bar and handed to the pickup shelf. */
export const HAS_WAIT = `o.status <> 'void' AND o.fired_at IS NOT NULL AND o.ready_at IS NOT NULL AND ${HAS_BAR_DRINK}`;

/**
 * A ticket's wait as the ticket history shows it: null without bar drinks or before ready. Stored
 * in orders.wait_seconds when the ticket becomes ready (settleTicket, the history generator; a
 * recall clears it), so lists sort on an index instead of working it out for every order.
 */
export const waitOfOrder = (d: Dialect) => `CASE WHEN o.fired_at IS NOT NULL AND o.ready_at IS NOT NULL AND ${HAS_BAR_DRINK} THEN ${waitSeconds(d)} END`;

/**
 * The part of an order's refunds that gave back the order's own money: refunded_cents counts the
 * tip too, and a refund gives the order's total back first, the tip only past it (refundSplit in
 * src/domain/tips.ts). Net revenue subtracts this part only; the tip's part comes off the tips.
 */
export const ORDER_REFUNDS = `CASE WHEN o.refunded_cents > o.total_cents THEN o.total_cents ELSE o.refunded_cents END`;
/** The tip the café kept: the order's tip less what a refund gave back of it. */
export const TIP_KEPT = `(o.tip_cents - (o.refunded_cents - ${ORDER_REFUNDS}))`;

/**
 * The part of an order's total paid in cash: all of it for a cash order; for one paid in parts, its
 * cash parts (split_cash_cents) up to the total — the cash pays the order first and any cash past
 * the total was tip (CASH_TIP). A card order's, and the rest of a split's, is card.
 */
export const CASH_OF_TOTAL = `CASE WHEN o.payment_method = 'cash' THEN o.total_cents WHEN o.payment_method = 'split' THEN (CASE WHEN o.split_cash_cents > o.total_cents THEN o.total_cents ELSE o.split_cash_cents END) ELSE 0 END`;
/** A cash order: paid in cash, or in parts that were all cash (two friends with notes). */
export const CASH_ORDER = `(o.payment_method = 'cash' OR (o.payment_method = 'split' AND o.split_cash_cents >= o.total_cents + o.tip_cents))`;
/** The tip kept in cash: a cash order's, or a split's cash past its total (never more than the tip kept). */
export const CASH_TIP = `CASE WHEN o.payment_method = 'cash' THEN ${TIP_KEPT} WHEN o.payment_method = 'split' AND o.split_cash_cents > o.total_cents THEN (CASE WHEN o.split_cash_cents - o.total_cents < ${TIP_KEPT} THEN o.split_cash_cents - o.total_cents ELSE ${TIP_KEPT} END) ELSE 0 END`;

/** A SUM or COUNT as it comes back: a number or null (SQLite), text for big integers (PostgreSQL). */
export type Sum = number | string | null;

/** One row of the paid-money totals (per hour, and per day in the rollups). */
export interface MoneyRow {
  hour: Sum;
  orders: Sum;
  gross: Sum;
  tax: Sum;
  discount: Sum;
  refunds: Sum;
  cash_orders: Sum;
  cash_cents: Sum;
}

/** One row of the line totals: sold (paid orders) and made (drinks done) per item, milk, station and hour. */
export interface LineRow {
  item: string;
  milk: string | null;
  station: Station;
  hour: Sum;
  sold: Sum;
  cents: Sum;
  milk_ml: Sum;
  shots: Sum;
  dose_dg: Sum;
}

/** A ticket with its wait in seconds (`w`), for the longest waits. */
export interface WaitRow {
  id: number;
  business_date: string;
  number: number;
  customer_name: string;
  w: Sum;
}

/** Sums come back as numbers or null (SQLite) or as text for big integers (PostgreSQL); reports want numbers, 0 for "none". */
export const n = (v: unknown): number => (v === null || v === undefined ? 0 : Number(v));
