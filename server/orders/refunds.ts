// Giving money back and voiding orders that were never fired. Both reach the bar live: a fully
// refunded order that was still being made leaves the bar.
import { refundPlan, type PaidPart } from '@/domain/split-payment';
import type { OrderView, SessionUser } from '@/domain/types';
import { conflict, invalid, notFound, notSetUp, upstreamFailed } from '@server/domain-errors';
import { GatewayRefused, GatewayUnavailable } from '@server/payments/gateway';
import { lockingRead } from '@server/db/dialect';
import type { Deps } from '@server/deps';
import { releaseStaleAttempts, settleOpenAttempts } from '@server/payments/card-settle';
import { appendEvent, runCommand } from '@server/events';
import { findOrderInLocation, loadOrder } from './order-views';
import { paidParts, paidSum } from './settle';
import { loadTicket } from '@server/tickets/ticket-views';
import { markDrinkRefunded } from './drink-refunds';

interface RefundInput {
  amountCents?: number;
  reason: string;
  /** one part of a split order; left out, the parts give back the last paid first */
  paymentId?: number;
  /** one drink's own money (drink-refunds.ts): the drink is named on the refund and marked once */
  orderItemId?: number;
}

/**
 * Which parts give back how much: the named part alone, or the last paid first (refundPlan).
 * What is left is judged from the parts alone, as one read gave them: the order's refunded_cents,
 * read at another moment, may be behind a refund that landed in between.
 */
export function planRefund(paid: PaidPart[], input: RefundInput) {
  if (input.paymentId !== undefined) {
    const part = paid.find((p) => p.paymentId === input.paymentId);
    if (!part) throw invalid('That is not a paid part of this order', [{ path: 'paymentId', message: 'Not a paid part of this order' }]);
    const left = part.amountCents - part.refundedCents;
    if (left <= 0) throw conflict(`Part ${part.part} has been refunded in full already`);
    const amount = input.amountCents ?? left;
    if (amount > left) throw invalid('That is more than is left of this part', [{ path: 'amountCents', message: `At most ${left} cents can be refunded` }]);
    return [{ paymentId: part.paymentId, amountCents: amount }];
  }
  // what the customer paid, the tip included: a full refund gives the tip back too
  const refundable = paidSum(paid) - paid.reduce((sum, p) => sum + p.refundedCents, 0);
  if (refundable <= 0) throw conflict('This order has been refunded in full already');
  const amount = input.amountCents ?? refundable;
  if (amount > refundable) {
    // a drink's amount is the server's own: past what is left, another refund got there first
    if (input.orderItemId !== undefined) throw conflict('Another refund changed this order; look again');
    throw invalid('That is more than is left to refund', [{ path: 'amountCents', message: `At most ${refundable} cents can be refunded` }]);
  }
  return refundPlan(paid, amount);
}

export async function refundOrder(deps: Deps, user: SessionUser, orderId: number, input: RefundInput) {
  const order = await findOrderInLocation(deps.db, user, orderId);
  if (!order) throw notFound('Order');
  const paid = await paidParts(deps.db, orderId);
  if (paid.length === 0) throw conflict('This order was never paid; void it instead');
  const plan = planRefund(paid, input);
  let result: OrderView | undefined;
  // one part after another, each its own refund at the card service and its own command
  for (const [i, step] of plan.entries()) {
    const part = paid.find((p) => p.paymentId === step.paymentId) as PaidPart;
    // a drink is marked by the first part's command (a retry then can't give it back twice)
    const drink = input.orderItemId ? { id: input.orderItemId, mark: i === 0 } : undefined;
    result = await refundPart(deps, user, orderId, part, step.amountCents, input.reason, drink);
  }
  return result as OrderView;
}

/** Give back `amount` of one paid part: at the card service first for a card, then the record. */
async function refundPart(
  deps: Deps,
  user: SessionUser,
  orderId: number,
  part: PaidPart,
  amount: number,
  reason: string,
  drink?: { id: number; mark: boolean },
) {
  let providerId: string | null = null;
  if (part.method === 'card') {
    if (!deps.payments) throw notSetUp('Card payments are not set up here');
    const payment = await deps.db('payments').where({ id: part.paymentId }).first('provider_id');
    // The key names what is being refunded, so a retried request can't refund twice.
    try {
      ({ providerId } = await deps.payments.refund({
        providerId: payment.provider_id,
        amountCents: amount,
        reason,
        // a drink's own refund is named by the drink: sent twice, even at once, the card service gives it back once
        idempotencyKey: drink
          ? `jugline-refund-${orderId}-${part.paymentId}-drink-${drink.id}`
          : `jugline-refund-${orderId}-${part.paymentId}-${part.refundedCents}-${amount}`,
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
    // holding the order: the same drink sent twice at once is refused (409) whatever the card service answered
    if (drink?.mark) await markDrinkRefunded(trx, orderId, drink.id, reason, at);
    const now = await paidParts(trx, orderId);
    const freshPart = now.find((p) => p.paymentId === part.paymentId) as PaidPart;
    if (freshPart.refundedCents !== part.refundedCents) {
      // Cash: nothing has been handed back yet, so refuse. Card: the provider has already given
      // this money back (it checks the charge's own balance), so it must be recorded, unless it
      // is the same refund again, replayed by the provider for the same idempotency key.
      if (!providerId) throw conflict('Another refund changed this order; look again');
      if (await trx('refunds').where({ order_id: orderId, provider_id: providerId }).first('id')) {
        return { result: await loadOrder(trx, orderId), events: [] };
      }
    }
    const refunded = fresh.refunded_cents + amount;
    const full = refunded === paidSum(now);
    // an order still waiting for its other parts was never made: all given back, it is void
    const waiting = fresh.status === 'pending';
    await trx('refunds').insert({
      order_id: orderId,
      payment_id: part.paymentId,
      amount_cents: amount,
      reason,
      provider_id: providerId,
      order_item_id: drink?.id ?? null,
      created_by: user.id,
      created_at: at,
    });
    await trx('orders')
      .where({ id: orderId })
      .update({
        refunded_cents: refunded,
        ...(waiting ? {} : { payment_status: full ? 'refunded' : 'paid' }),
        // drinks not yet made are not made: the ticket leaves the bar
        ...(full && (fresh.status === 'open' || waiting) ? { status: 'void', void_reason: reason } : {}),
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
    // a split with a part paid: that money goes back first (a refund of the whole voids it)
    if (paidSum(await paidParts(trx, orderId)) > order.refunded_cents) {
      throw conflict('Part of this order is paid; refund it, and the order is void once all of it is back');
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
