// SQL pieces shared by the report and the ticket history (orders aliased `o`).
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

/** Sums come back as numbers or null (SQLite) or as text for big integers (PostgreSQL); reports want numbers, 0 for "none". */
export const n = (v: unknown): number => (v === null || v === undefined ? 0 : Number(v));
