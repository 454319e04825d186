// The quoted wait for a new order, from the bar's queue and its recent pace.
import type { Knex } from 'knex';
import { barPace, type TimedDrink } from '../../src/domain/make-times';
import { quoteWaitSeconds } from '../../src/domain/quote';

/** How many recent drinks set the pace (their batches are taken whole, so it may be a few more). */
const RECENT_DRINKS = 30;
/** The most drinks one bump can finish: a whole ticket (an order holds at most 40 lines). */
const LARGEST_BATCH = 40;

type Db = Knex | Knex.Transaction;

/**
 * The location's bar drinks bumped most recently, with every other drink of their batches: a
 * batch's time is shared among all its drinks, so a batch cut in two would read too slow. One
 * read of a few more rows than needed, then the edge batch completed from them.
 */
export async function recentlyMade(db: Db, locationId: number, limit = RECENT_DRINKS): Promise<TimedDrink[]> {
  const rows = await db('order_items')
    .join('orders', 'orders.id', 'order_items.order_id')
    .where({ 'orders.location_id': locationId, 'order_items.status': 'done', 'order_items.station': 'bar' })
    .whereNotNull('order_items.started_at')
    .orderBy('order_items.done_at', 'desc')
    .limit(limit + LARGEST_BATCH)
    .select('order_items.started_at', 'order_items.done_at', 'order_items.bump_seq');
  const batches = new Set(rows.slice(0, limit).map((r) => r.bump_seq).filter((b) => b !== null));
  return rows
    .filter((r, i) => i < limit || (r.bump_seq !== null && batches.has(r.bump_seq)))
    .map((r) => ({ startedMs: Date.parse(r.started_at), doneMs: Date.parse(r.done_at), bumpSeq: r.bump_seq ?? null }));
}

export async function quoteForNewOrder(db: Db, locationId: number, drinksInOrder: number, baristas: number): Promise<number> {
  const ahead = await db('order_items')
    .join('orders', 'orders.id', 'order_items.order_id')
    .where({ 'orders.location_id': locationId, 'orders.status': 'open', 'order_items.station': 'bar' })
    .whereNot('order_items.status', 'done')
    .count<{ n: number }>({ n: '*' })
    .first();
  const pace = barPace(await recentlyMade(db, locationId));
  return quoteWaitSeconds({ drinksAhead: Number(ahead?.n ?? 0), drinksInOrder, baristas, pace });
}
