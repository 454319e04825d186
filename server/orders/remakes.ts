// A drink made again at no charge: a new drink on the same ticket, pointing at the one it
// replaces, back on the Bar. Reasons and the waste they cost are src/domain/remakes.ts.
import type { RemakeReason } from '@/domain/remakes';
import type { OrderView, SessionUser } from '@/domain/types';
import { isUniqueViolation, lockingRead } from '@server/db/dialect';
import { json } from '@server/db/rows';
import { conflict, notFound } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { appendEvent, runCommand } from '@server/events';
import { loadTicket } from '@server/tickets/ticket-views';
import { loadOrder } from './order-views';

/** Columns a remake copies from the drink it replaces: the same drink, as it was sold. */
const SAME_DRINK = [
  'menu_item_id',
  'item_name',
  'station',
  'size_id',
  'size_name',
  'volume_ml',
  'milk_id',
  'milk_name',
  'milk_code',
  'shots',
  'milk_ml',
  'texture',
  'kids_temp',
  'note',
  'dose_dg',
] as const;

/**
 * Remake one made drink of a paid order. The remake is queued on the same ticket at no charge;
 * its allergy, if the ticket has one, is read again before it is bumped. A ready or collected
 * ticket goes back to open, so the Bar shows it again, and is ready again when the remake is
 * bumped (settleTicket, as any bump).
 *
 * The ticket's wait after a remake: fired_at is kept, so the Bar card's age and the stored wait
 * (fired → ready, orders.wait_seconds and the reports) run from the order to the moment the
 * remade drink is bumped — how long this customer waited for a drink that was right. The first
 * ready time is not kept; the remake itself is counted, with its reason, in the reports' waste.
 * The bar's pace (quotes.ts) counts the remade drink from remade_at, when it reached the bar.
 *
 * Twice at once: the order's row is held while the drink is checked and the remake written, and
 * order_items.remake_of is unique, so one remake is made and the other request is answered 409.
 */
export async function remakeDrink(deps: Deps, user: SessionUser, drinkId: number, input: { reason: RemakeReason; note?: string }): Promise<OrderView> {
  try {
    return await runCommand(deps, async (trx) => {
      const found = await trx('order_items')
        .join('orders', 'orders.id', 'order_items.order_id')
        .where({ 'order_items.id': drinkId, 'orders.location_id': user.locationId })
        .first('order_items.order_id');
      if (!found) throw notFound('Drink');
      const order = await lockingRead(trx, trx('orders').where({ id: found.order_id })).first();
      const drink = await trx('order_items').where({ id: drinkId }).first();
      if (drink.station !== 'bar') throw notFound('Drink');
      if (order.payment_status === 'unpaid' || order.status === 'pending') throw conflict('This order has not been paid: it was never made');
      if (order.status === 'void') throw conflict('This order was voided');
      if (drink.refunded_at) throw conflict(`This ${drink.item_name} was refunded; it is not made again`);
      if (drink.status !== 'done') throw conflict(`This ${drink.item_name} is still on the bar: it has not been made yet`);
      const again = await trx('order_items').where({ remake_of: drinkId }).first('id');
      if (again) throw conflict(`This ${drink.item_name} has been remade already`);
      const at = deps.clock().toISOString();
      const last = await trx('order_items').where({ order_id: order.id }).max<{ n: number | null }>({ n: 'line_no' }).first();
      const same = Object.fromEntries(SAME_DRINK.map((c) => [c, drink[c]]));
      await trx('order_items').insert({
        ...same,
        // json columns: SQLite reads them back as text, PostgreSQL parsed; written as text either way
        extras: JSON.stringify(json(drink.extras, [])),
        contains: JSON.stringify(json(drink.contains, [])),
        order_id: order.id,
        line_no: Number(last?.n ?? 0) + 1,
        price_cents: 0,
        status: 'queued',
        remake_of: drinkId,
        remake_reason: input.reason,
        remake_note: input.note || null,
        remade_by: user.id,
        remade_at: at,
      });
      // back on the Bar; a collected order is collected again when the remake is handed over
      if (order.status !== 'open') {
        await trx('orders').where({ id: order.id }).update({ status: 'open', ready_at: null, wait_seconds: null, collected_at: null });
      }
      const ticket = await loadTicket(trx, order.id);
      const event = await appendEvent(trx, user.locationId, 'drink.remade', ticket, at, user.id);
      return { result: await loadOrder(trx, order.id), events: [event] };
    });
  } catch (err) {
    // the unique remake_of: another screen's remake of this drink committed first
    if (isUniqueViolation(err)) throw conflict('This drink has been remade already');
    throw err;
  }
}
