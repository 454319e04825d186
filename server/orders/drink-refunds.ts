// One drink's own money back. How much is src/domain/remakes.ts (drinkRefundCents); the refund
// itself is refundOrder's (refunds.ts: cash or card, one refunds row, the order's event), which
// names the drink and, inside its transaction, marks it here.
import type { Knex } from 'knex';
import { drinkRefundCents } from '@/domain/remakes';
import { formatCents } from '@/domain/money';
import { amountDueCents } from '@/domain/tips';
import type { OrderView, SessionUser } from '@/domain/types';
import { conflict, notFound } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { settleTicket } from '@server/tickets/bar-rows';
import { refundOrder } from './refunds';

/** Give back one bar drink's share of what the customer paid (the tip stays: tips.ts). */
export async function refundDrink(deps: Deps, user: SessionUser, drinkId: number, reason: string): Promise<OrderView> {
  const drink = await deps
    .db('order_items')
    .join('orders', 'orders.id', 'order_items.order_id')
    .where({ 'order_items.id': drinkId, 'orders.location_id': user.locationId })
    .first('order_items.*');
  if (!drink || drink.station !== 'bar') throw notFound('Drink');
  if (drink.remake_of != null) throw conflict('A remake was made at no charge: there is nothing to give back for it');
  if (drink.refunded_at) throw conflict(`This ${drink.item_name} has been refunded already`);
  const order = await deps.db('orders').where({ id: drink.order_id }).first();
  if (order.payment_status === 'unpaid') throw conflict('This order was never paid; void it instead');
  const standing = await deps
    .db('order_items')
    .where({ order_id: order.id })
    .whereNull('remake_of')
    .whereNull('refunded_at')
    .sum<{ cents: number | string | null }>({ cents: 'price_cents' })
    .first();
  const amount = drinkRefundCents({ subtotalCents: order.subtotal_cents, totalCents: order.total_cents }, Number(standing?.cents ?? 0), drink.price_cents);
  if (amount <= 0) throw conflict(`This ${drink.item_name} was not charged: there is nothing to give back`);
  const left = amountDueCents(order.total_cents, order.tip_cents) - order.refunded_cents;
  if (amount > left) {
    const location = await deps.db('locations').where({ id: user.locationId }).first('currency', 'locale');
    throw conflict(`Only ${formatCents(Math.max(0, left), location.currency, location.locale)} is left to refund on this order; refund an amount instead`);
  }
  return refundOrder(deps, user, order.id, { amountCents: amount, reason, orderItemId: drinkId });
}

/**
 * Inside refundOrder's transaction, holding the order: mark the drink refunded, conditionally (a
 * drink refunded a moment earlier makes this 409 and the whole refund is undone). A drink not yet
 * made then leaves the bar (ticket-views.ts reads it no more); if it was the ticket's last one
 * still to make, the ticket is ready, or, when nothing on it was made, it leaves the bar as void.
 */
export async function markDrinkRefunded(trx: Knex.Transaction, orderId: number, drinkId: number, reason: string, at: string) {
  const changed = await trx('order_items').where({ id: drinkId, order_id: orderId, station: 'bar' }).whereNull('refunded_at').update({ refunded_at: at });
  if (changed !== 1) throw conflict('This drink has been refunded already');
  const order = await trx('orders').where({ id: orderId }).first('status');
  if (order.status !== 'open') return;
  const onTicket = await trx('order_items')
    .where({ order_id: orderId, station: 'bar' })
    .andWhere((w) => w.whereNull('refunded_at').orWhere('status', 'done'))
    .count<{ n: number | string }>({ n: '*' })
    .first();
  if (Number(onTicket?.n) === 0) await trx('orders').where({ id: orderId, status: 'open' }).update({ status: 'void', void_reason: reason });
  else await settleTicket(trx, orderId, at);
}
