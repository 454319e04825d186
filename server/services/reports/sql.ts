// SQL pieces shared by the report and the ticket history (orders aliased `o`).

/** Fired → ready in seconds, to the millisecond; timestamps are ISO strings SQLite's julianday reads. */
export const WAIT_SECONDS = `ROUND((julianday(o.ready_at) - julianday(o.fired_at)) * 86400, 3)`;

export const HAS_BAR_DRINK = `EXISTS (SELECT 1 FROM order_items b WHERE b.order_id = o.id AND b.station = 'bar')`;

export const BAR_DRINKS = `(SELECT COUNT(*) FROM order_items b WHERE b.order_id = o.id AND b.station = 'bar')`;

/** A ticket whose wait counts: made at the bar and handed to the pickup shelf. */
export const HAS_WAIT = `o.status <> 'void' AND o.fired_at IS NOT NULL AND o.ready_at IS NOT NULL AND ${HAS_BAR_DRINK}`;

/**
 * A ticket's wait as the ticket history shows it: null without bar drinks or before ready. Stored
 * in orders.wait_seconds when the ticket becomes ready (settleTicket, the history generator; a
 * recall clears it), so lists sort on an index instead of working it out for every order.
 */
export const WAIT_OF_ORDER = `CASE WHEN o.fired_at IS NOT NULL AND o.ready_at IS NOT NULL AND ${HAS_BAR_DRINK} THEN ${WAIT_SECONDS} END`;

/** Knex hands SQLite sums back as numbers or null; reports want 0 for "none". */
export const n = (v: unknown): number => (v === null || v === undefined ? 0 : Number(v));
