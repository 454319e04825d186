// Giving money back and voiding orders that were never fired. Both reach the bar live: a fully
// refunded order that was still being made leaves the bar.
import type { SessionUser } from '@/domain/types';
import { amountDueCents } from '@/domain/tips';
import { conflict, invalid, notFound, notSetUp, upstreamFailed } from '@server/domain-errors';
import { GatewayRefused, GatewayUnavailable } from '@server/payments/gateway';
import { lockingRead } from '@server/db/dialect';
import type { Deps } from '@server/deps';
import { releaseStaleAttempts, settleOpenAttempts } from '@server/payments/card-settle';
import { appendEvent, runCommand } from '@server/events';
import { findOrderInLocation, loadOrder } from './order-views';
import { loadTicket } from '@server/tickets/ticket-views';
import { markDrinkRefunded } from './drink-refunds';

export async function refundOrder(deps: Deps, user: SessionUser, orderId: number, input: { amountCents?: number; reason: string; orderItemId?: number }) {
  const order = await findOrderInLocation(deps.db, user, orderId);
  if (!order) throw notFound('Order');
  if (order.payment_status === 'unpaid') throw conflict('This order was never paid; void it instead');
  // what the customer paid, the tip included: a full refund gives the tip back too
  const refundable = amountDueCents(order.total_cents, order.tip_cents) - order.refunded_cents;
  if (refundable <= 0) throw conflict('This order has been refunded in full already');
  const amount = input.amountCents ?? refundable;
  if (amount > refundable) {
    throw invalid('That is more than is left to refund', [{ path: 'amountCents', message: `At most ${refundable} cents can be refunded` }]);
  }
  const payment = await deps.db('payments').where({ order_id: orderId, status: 'succeeded' }).first();
  if (!payment) throw conflict('No successful payment to refund');

  let providerId: string | null = null;
  if (payment.method === 'card') {
    if (!deps.payments) throw notSetUp('Card payments are not set up here');
    // The key names what is being refunded, so a retried request can't refund twice.
    try {
      ({ providerId } = await deps.payments.refund({
        providerId: payment.provider_id,
        amountCents: amount,
        reason: input.reason,
        // a drink's own refund is named by the drink alone: sent twice, even at once, the card service gives it back once
        idempotencyKey: input.orderItemId
          ? `jugline-refund-${orderId}-drink-${input.orderItemId}`
          : `jugline-refund-${orderId}-${order.refunded_cents}-${amount}`,
      }));
    } catch (err) {
      if (err instanceof GatewayRefused) throw conflict(`The card service refused the refund: ${err.message}`);
      if (err instanceof GatewayUnavailable) {
        throw upstreamFailed('The card service did not answer; nothing was refunded. Try again.');
      }
      throw err;
    }
  }

  return runCommand(deps, async (trx) => {
    const at = deps.clock().toISOString();
    // re-read inside the transaction, holding the order: another refund may have landed meanwhile,
    // and one sent at the same moment waits here until this one has committed
    const fresh = await lockingRead(trx, trx('orders').where({ id: orderId })).first();
    // one drink's own money (drink-refunds.ts): the drink is marked once, holding the order, so
    // the same drink sent twice at once is refused (409) whatever the card service answered
    if (input.orderItemId) await markDrinkRefunded(trx, orderId, input.orderItemId, input.reason, at);
    if (fresh.refunded_cents !== order.refunded_cents) {
      // Cash: nothing has been handed back yet, so refuse. Card: the provider has already given
      // this money back (it checks the charge's own balance), so it must be recorded, unless it
      // is the same refund again, replayed by the provider for the same idempotency key.
      if (!providerId) throw conflict('Another refund changed this order; look again');
      if (await trx('refunds').where({ order_id: orderId, provider_id: providerId }).first('id')) {
        return { result: await loadOrder(trx, orderId), events: [] };
      }
    }
    const refunded = fresh.refunded_cents + amount;
    const full = refunded === amountDueCents(fresh.total_cents, fresh.tip_cents);
    await trx('refunds').insert({
      order_id: orderId,
      payment_id: payment.id,
      amount_cents: amount,
      reason: input.reason,
      provider_id: providerId,
      order_item_id: input.orderItemId ?? null,
      created_by: user.id,
      created_at: at,
    });
    await trx('orders')
      .where({ id: orderId })
      .update({
        refunded_cents: refunded,
        payment_status: full ? 'refunded' : 'paid',
        // drinks not yet made are not made: the ticket leaves the bar
        ...(full && fresh.status === 'open' ? { status: 'void', void_reason: input.reason } : {}),
      });
    const ticket = await loadTicket(trx, orderId);
    const event = await appendEvent(trx, user.locationId, 'order.refunded', ticket, at, user.id);
    return { result: await loadOrder(trx, orderId), events: [event] };
  });
}

export async function voidOrder(deps: Deps, user: SessionUser, orderId: number, reason: string) {
  if (await findOrderInLocation(deps.db, user, orderId)) await releaseStaleAttempts(deps, orderId);
  const result = await runCommand(deps, async (trx) => {
    const order = await lockingRead(trx, trx('orders').where({ id: orderId, location_id: user.locationId })).first();
    if (!order) throw notFound('Order');
    if (order.status !== 'pending' || order.payment_status !== 'unpaid') {
      throw conflict('Only an order that was never paid can be voided; refund a paid one');
    }
    const live = await trx('payments').where({ order_id: orderId, status: 'processing' }).first('id');
    if (live) throw conflict('A card payment for this order is in progress');
    const at = deps.clock().toISOString();
    await trx('orders').where({ id: orderId }).update({ status: 'void', void_reason: reason });
    const declined = await trx('payments').where({ order_id: orderId, status: 'declined' }).whereNotNull('provider_id').select('id', 'provider_id');
    await trx('payments')
      .whereIn(
        'id',
        declined.map((d) => d.id),
      )
      .update({ status: 'canceled', updated_at: at });
    const ticket = await loadTicket(trx, orderId);
    const event = await appendEvent(trx, user.locationId, 'order.voided', ticket, at, user.id);
    return { result: { order: await loadOrder(trx, orderId), toCancel: declined.map((d) => d.provider_id as string) }, events: [event] };
  });
  // Tidy the provider's side too; a failure here changes nothing for the café.
  for (const providerId of result.toCancel) await deps.payments?.cancel(providerId).catch(() => undefined);
  // A card whose answer was lost may have been charged: the order is void now, so such a charge
  // is given back. If the card service can't say yet, its webhook or the card check does it later.
  await settleOpenAttempts(deps, orderId);
  return result.order;
}
