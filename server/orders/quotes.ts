// The Counter's quoted wait, from the bar as it is: the drinks on it now and its pace over the
// last 30 minutes (busyPace: the barista-time the bar was busy over the drinks it bumped).
import { busyPace, FORGOTTEN_AFTER_MS, type BarDrink, type BarPace } from '@/domain/make-times';
import { quoteWaitSeconds } from '@/domain/quote';
import type { CounterWaitNow } from '@/domain/wait-now';
import type { Deps } from '@server/deps';
import { loadLocation } from '@server/menu/menu';
import type { Db } from '@server/db/knex';

/** How far back the pace looks. */
export const PACE_WINDOW_MS = 30 * 60_000;

export interface BarNow {
  /** Bar drinks queued or being made. */
  drinksAhead: number;
  pace: BarPace;
}

/**
 * The location's bar drinks still on the bar or fired in the pace window (an open ticket's drinks,
 * and those of tickets fired since: two branches, each through an index of its own).
 */
async function barDrinks(db: Db, locationId: number, sinceIso: string): Promise<(BarDrink & { onBar: boolean })[]> {
  const rows = await db('order_items')
    .join('orders', 'orders.id', 'order_items.order_id')
    .where('order_items.station', 'bar')
    .whereNotNull('orders.fired_at')
    .where((w) => {
      w.where({ 'orders.location_id': locationId, 'orders.status': 'open' });
      w.orWhere((x) => x.where('orders.location_id', locationId).where('orders.created_at', '>=', sinceIso));
    })
    .whereNot('orders.status', 'void')
    .select(
      'orders.status as order_status',
      'orders.fired_at',
      'order_items.status',
      'order_items.done_at',
      'order_items.refunded_at',
      'order_items.remade_at',
    );
  return rows.map((r) => ({
    // a remake reaches the bar when it is asked for, not when its order was fired
    firedMs: Date.parse(r.remade_at ?? r.fired_at),
    doneMs: r.status === 'done' && r.done_at ? Date.parse(r.done_at) : null,
    onBar: r.order_status === 'open' && r.status !== 'done' && !r.refunded_at,
  }));
}

export async function barNow(db: Db, locationId: number, now: Date, baristas: number): Promise<BarNow> {
  const since = now.getTime() - PACE_WINDOW_MS;
  // tickets fired a while before the window still had drinks on the bar in it
  const drinks = await barDrinks(db, locationId, new Date(since - FORGOTTEN_AFTER_MS).toISOString());
  return { drinksAhead: drinks.filter((d) => d.onBar).length, pace: busyPace(drinks, baristas, since) };
}

export async function quoteForNewOrder(db: Db, locationId: number, now: Date, drinksInOrder: number, baristas: number): Promise<number> {
  const { drinksAhead, pace } = await barNow(db, locationId, now, baristas);
  return quoteWaitSeconds({ drinksAhead, drinksInOrder, baristas, pace });
}

/** The wait the Counter can tell a customer before they pay: the quote their drinks would get now. */
export async function waitNowForCounter(deps: Deps, locationId: number, drinks: number): Promise<CounterWaitNow> {
  const { baristasOnBar: baristas } = await loadLocation(deps.db, locationId);
  const { drinksAhead, pace } = await barNow(deps.db, locationId, deps.clock(), baristas);
  return { drinksOnBar: drinksAhead, baristas, seconds: quoteWaitSeconds({ drinksAhead, drinksInOrder: Math.max(1, drinks), baristas, pace }) };
}
