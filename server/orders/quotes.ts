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

/** The location's fired bar drinks that the quote looks at: those of open tickets, and those of tickets taken since `sinceIso`. */
function barDrinksOf(db: Db, locationId: number, sinceIso: string) {
  return db('order_items')
    .join('orders', 'orders.id', 'order_items.order_id')
    .where('order_items.station', 'bar')
    .whereNotNull('orders.fired_at')
    .where((w) => {
      // two branches, each through an index of its own
      w.where({ 'orders.location_id': locationId, 'orders.status': 'open' });
      w.orWhere((x) => x.where('orders.location_id', locationId).where('orders.created_at', '>=', sinceIso));
    })
    .whereNot('orders.status', 'void');
}

// a remake reaches the bar when it is asked for, not when its order was fired
const FIRED = 'COALESCE(order_items.remade_at, orders.fired_at)';

/**
 * The drinks on the bar now, counted by the database, and the pace from the drinks that can bear
 * on it, read as rows: fired no later than the last bump (busyPace's span ends there, so a drink
 * still waiting after it changes nothing), and either fired since `fromIso` or bumped inside the
 * window (one fired earlier and not bumped since has left the bar by the window: busyPace's
 * FORGOTTEN_AFTER_MS). A queue nobody bumps is counted, not read. The pace is busyPace's over
 * every drink, but for a drink bumped the very millisecond it was fired.
 */
export async function barNow(db: Db, locationId: number, now: Date, baristas: number): Promise<BarNow> {
  const since = now.getTime() - PACE_WINDOW_MS;
  const fromIso = new Date(since - FORGOTTEN_AFTER_MS).toISOString();
  const counts = await barDrinksOf(db, locationId, fromIso)
    .select(
      db.raw(`SUM(CASE WHEN orders.status = 'open' AND order_items.status <> 'done' AND order_items.refunded_at IS NULL THEN 1 ELSE 0 END) AS on_bar`),
      db.raw(`MAX(CASE WHEN order_items.status = 'done' THEN order_items.done_at END) AS last_bump`),
    )
    .first<{ on_bar: number | string | null; last_bump: string | null }>();
  const drinksAhead = Number(counts?.on_bar ?? 0);
  const lastBump = counts?.last_bump ?? null;
  if (!lastBump) return { drinksAhead, pace: { drinks: 0, totalMs: 0 } };
  const rows = await barDrinksOf(db, locationId, fromIso)
    .where((w) => w.whereRaw(`${FIRED} >= ?`, [fromIso]).orWhere('order_items.done_at', '>=', new Date(since).toISOString()))
    .whereRaw(`${FIRED} <= ?`, [lastBump])
    .select(db.raw(`${FIRED} AS fired`), 'order_items.status', 'order_items.done_at');
  const drinks: BarDrink[] = rows.map((r: { fired: string; status: string; done_at: string | null }) => ({
    firedMs: Date.parse(r.fired),
    doneMs: r.status === 'done' && r.done_at ? Date.parse(r.done_at) : null,
  }));
  return { drinksAhead, pace: busyPace(drinks, baristas, since) };
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
