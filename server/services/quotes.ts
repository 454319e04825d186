// The quoted wait for a new order, from the bar's queue and its recent pace.
import type { Knex } from 'knex';
import { quoteWaitSeconds } from '../../src/domain/quote';

/** How many recent drinks set the pace. */
const RECENT_DRINKS = 30;

export async function quoteForNewOrder(
  db: Knex | Knex.Transaction,
  locationId: number,
  drinksInOrder: number,
  baristas: number,
): Promise<number> {
  const ahead = await db('order_items')
    .join('orders', 'orders.id', 'order_items.order_id')
    .where({ 'orders.location_id': locationId, 'orders.status': 'open', 'order_items.station': 'bar' })
    .whereNot('order_items.status', 'done')
    .count<{ n: number }>({ n: '*' })
    .first();
  const recent = await db('order_items')
    .join('orders', 'orders.id', 'order_items.order_id')
    .where({ 'orders.location_id': locationId, 'order_items.status': 'done' })
    .whereNotNull('order_items.started_at')
    .orderBy('order_items.done_at', 'desc')
    .limit(RECENT_DRINKS)
    .select('order_items.started_at', 'order_items.done_at');
  const recentMakeSeconds = recent
    .map((r) => (Date.parse(r.done_at) - Date.parse(r.started_at)) / 1000)
    .filter((s) => s > 0);
  return quoteWaitSeconds({ drinksAhead: Number(ahead?.n ?? 0), drinksInOrder, baristas, recentMakeSeconds });
}
