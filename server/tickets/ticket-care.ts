// The rest of a ticket's life at the bar: the allergy read, a lead's rush, and its collection at pickup.
import type { SessionUser } from '@/domain/types';
import { json } from '@server/db/rows';
import { conflict, notFound } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { appendEvent, runCommand } from '@server/events';
import { loadTicket } from './ticket-views';

/** A barista confirms reading the allergy before the drink can be bumped; who and when is kept. */
export function acknowledgeAllergy(deps: Deps, user: SessionUser, drinkId: number) {
  return runCommand(deps, async (trx) => {
    const drink = await trx('order_items')
      .join('orders', 'orders.id', 'order_items.order_id')
      .where({ 'order_items.id': drinkId, 'orders.location_id': user.locationId, 'order_items.station': 'bar' })
      .first('order_items.id', 'order_items.order_id', 'order_items.allergy_ack_at', 'orders.allergens', 'orders.allergy_note', 'orders.status');
    if (!drink) throw notFound('Drink');
    if (drink.status !== 'open') throw conflict('This drink is not on an open ticket');
    if (json<string[]>(drink.allergens, []).length === 0 && !drink.allergy_note) throw conflict('This drink has no allergy to acknowledge');
    if (drink.allergy_ack_at) throw conflict('This allergy was already acknowledged');
    const at = deps.clock().toISOString();
    await trx('order_items').where({ id: drinkId }).update({ allergy_ack_at: at, allergy_ack_by: user.id });
    const ticket = await loadTicket(trx, drink.order_id);
    return { result: ticket, events: [await appendEvent(trx, user.locationId, 'drink.allergy_acknowledged', ticket, at, user.id)] };
  });
}

/** A lead moves a ticket to the front of every lane it has drinks in. */
export function rushTicket(deps: Deps, user: SessionUser, orderId: number) {
  return runCommand(deps, async (trx) => {
    const order = await trx('orders').where({ id: orderId, location_id: user.locationId }).first();
    if (!order) throw notFound('Ticket');
    if (order.status !== 'open') throw conflict('Only a ticket still at the bar can be rushed');
    if (order.rushed_at) throw conflict('This ticket is already rushed');
    const at = deps.clock().toISOString();
    await trx('orders').where({ id: orderId }).update({ rushed_at: at });
    const ticket = await loadTicket(trx, orderId);
    return { result: ticket, events: [await appendEvent(trx, user.locationId, 'ticket.rushed', ticket, at, user.id)] };
  });
}

/** The customer took their order: it leaves the Pickup board. */
export function collectTicket(deps: Deps, user: SessionUser, orderId: number) {
  return runCommand(deps, async (trx) => {
    const order = await trx('orders').where({ id: orderId, location_id: user.locationId }).first();
    if (!order) throw notFound('Ticket');
    if (order.status !== 'ready') throw conflict(order.status === 'collected' ? 'Already collected' : 'This ticket is not ready yet');
    const at = deps.clock().toISOString();
    await trx('orders').where({ id: orderId }).update({ status: 'collected', collected_at: at });
    const ticket = await loadTicket(trx, orderId);
    return { result: ticket, events: [await appendEvent(trx, user.locationId, 'ticket.collected', ticket, at, user.id)] };
  });
}
