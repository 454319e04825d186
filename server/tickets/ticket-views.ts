// Reading tickets (orders with their bar drinks) into the shape the screens use.
import type { DrinkView, JugRef, TicketView } from '@/domain/types';
import { bool, json } from '@server/db/rows';
import type { Db } from '@server/db/knex';
import type { Flag, Row } from '@server/db/tables';
import type { SteamedTexture } from '@/domain/jug-plan';
import { remakeMark } from '@server/orders/order-views';

/** A bar drink as loadTickets reads it: its row, who acted on it, and its started jug if any. */
type DrinkRow = Row<'order_items'> & {
  ack_by_name: string | null;
  started_by_name: string | null;
  done_by_name: string | null;
  milk_sort: number | null;
  jug_id: number | null;
  jug_capacity_ml: number;
  jug_fill_line_ml: number;
  jug_min_fill_ml: number;
  jug_cold_ml: number;
  jug_waste_ml: number;
  jug_steam_for: SteamedTexture;
  jug_fits: Flag;
};

function toDrink(r: DrinkRow): DrinkView {
  const remake = remakeMark(r);
  return {
    id: r.id,
    ticketId: r.order_id,
    itemName: r.item_name,
    sizeName: r.size_name,
    volumeMl: r.volume_ml,
    // a line's milk name and code are stored with its milk id (order-item-row.ts)
    milk: r.milk_id ? { id: r.milk_id, name: r.milk_name!, code: r.milk_code!, sort: r.milk_sort ?? 0 } : null,
    shots: r.shots,
    milkMl: r.milk_ml,
    texture: r.texture,
    ...(bool(r.kids_temp) ? { kidsTemp: true } : {}),
    extras: json<{ name: string }[]>(r.extras, []).map((m) => m.name),
    note: r.note,
    contains: json<string[]>(r.contains, []),
    doseDg: r.dose_dg,
    status: r.status,
    startedAt: r.started_at,
    doneAt: r.done_at,
    allergyAckAt: r.allergy_ack_at ?? null,
    allergyAckBy: r.ack_by_name ?? null,
    startedBy: r.started_by_name ?? null,
    doneBy: r.done_by_name ?? null,
    jug: jugOf(r),
    ...(remake ? { remake } : {}),
  };
}

/** The started jug a drink row was joined with (jug_* columns), or null. */
function jugOf(r: DrinkRow): JugRef | null {
  if (r.jug_id == null) return null;
  return {
    id: r.jug_id,
    pitcher: { capacityMl: r.jug_capacity_ml, fillLineMl: r.jug_fill_line_ml, minFillMl: r.jug_min_fill_ml },
    coldMl: r.jug_cold_ml,
    wasteMl: r.jug_waste_ml,
    steamFor: r.jug_steam_for,
    // a jug holds drinks of one temperature (jug-plan.ts), so any of its drinks tells it
    ...(bool(r.kids_temp) ? { kidsTemp: true } : {}),
    fits: bool(r.jug_fits),
  };
}

/**
 * `names`: people the caller knows already (the person taking the order, from the session), so
 * their name is not read again.
 */
export async function loadTickets(db: Db, orders: Row<'orders'>[], names: ReadonlyMap<number, string> = new Map()): Promise<TicketView[]> {
  if (orders.length === 0) return [];
  const drinks = await db('order_items')
    .leftJoin('users', 'users.id', 'order_items.allergy_ack_by')
    .leftJoin('users as starter', 'starter.id', 'order_items.started_by')
    .leftJoin('users as bumper', 'bumper.id', 'order_items.done_by')
    .leftJoin('jug_drinks', 'jug_drinks.order_item_id', 'order_items.id')
    .leftJoin('jugs', 'jugs.id', 'jug_drinks.jug_id')
    .leftJoin('milk_options', 'milk_options.id', 'order_items.milk_id')
    .whereIn(
      'order_items.order_id',
      orders.map((o) => o.id),
    )
    .andWhere('order_items.station', 'bar')
    // a drink refunded before it was made is not made: it leaves the bar (a made one stays, done)
    .andWhere((w) => w.whereNull('order_items.refunded_at').orWhere('order_items.status', 'done'))
    .orderBy(['order_items.order_id', 'order_items.line_no'])
    .select(
      'order_items.*',
      'users.name as ack_by_name',
      'starter.name as started_by_name',
      'bumper.name as done_by_name',
      'jugs.id as jug_id',
      'jugs.capacity_ml as jug_capacity_ml',
      'jugs.fill_line_ml as jug_fill_line_ml',
      'jugs.min_fill_ml as jug_min_fill_ml',
      'jugs.cold_ml as jug_cold_ml',
      'jugs.waste_ml as jug_waste_ml',
      'jugs.steam_for as jug_steam_for',
      'jugs.fits as jug_fits',
      'milk_options.sort as milk_sort',
    );
  const takers = new Map<number, string>(names);
  const takerIds = [...new Set(orders.map((o) => o.taken_by).filter((id): id is number => id != null && !takers.has(id)))];
  if (takerIds.length) for (const u of await db('users').whereIn('id', takerIds).select('id', 'name')) takers.set(u.id, u.name);
  const byOrder = new Map<number, DrinkView[]>();
  for (const d of drinks) byOrder.set(d.order_id, [...(byOrder.get(d.order_id) ?? []), toDrink(d)]);
  return orders.map((o) => ({
    id: o.id,
    number: o.number,
    customerName: o.customer_name,
    status: o.status,
    firedAt: o.fired_at ?? o.created_at, // a card order waiting for payment has not been fired yet
    readyAt: o.ready_at,
    collectedAt: o.collected_at,
    service: o.service,
    allergens: json<string[]>(o.allergens, []),
    allergyNote: o.allergy_note ?? null,
    rushedAt: o.rushed_at ?? null,
    takenBy: (o.taken_by != null && takers.get(o.taken_by)) || null,
    drinks: byOrder.get(o.id) ?? [],
  }));
}

export async function loadTicket(db: Db, orderId: number): Promise<TicketView> {
  const order = await db('orders').where({ id: orderId }).first();
  const [ticket] = await loadTickets(db, [order]);
  return ticket;
}

/** Open tickets, plus ready ones still inside the Pickup board's timeout. */
export async function loadBoardTickets(db: Db, locationId: number, nowMs: number, pickupTimeoutSeconds: number) {
  const readySince = new Date(nowMs - pickupTimeoutSeconds * 1000).toISOString();
  // Two reads on the (location_id, status) index: with the OR in one query SQLite scans every
  // order the café ever had (≈20 ms over a year of history, on every board and /bar render).
  const [open, ready] = await Promise.all([
    db('orders').where({ location_id: locationId, status: 'open' }),
    db('orders').where({ location_id: locationId, status: 'ready' }).andWhere('ready_at', '>', readySince),
  ]);
  const byFired = (a: Row<'orders'>, b: Row<'orders'>) =>
    (a.fired_at ?? '') < (b.fired_at ?? '') ? -1 : (a.fired_at ?? '') > (b.fired_at ?? '') ? 1 : a.id - b.id;
  return loadTickets(db, [...open, ...ready].sort(byFired));
}
