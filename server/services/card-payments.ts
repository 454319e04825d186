// Card payments. An attempt is recorded as "processing" before the provider is asked, and a
// unique index allows one live attempt per order, so retries and races can never charge twice.
// The order is fired to the bar only when the payment has succeeded — answered by the API call
// or, if the answer was lost, by the provider's webhook.
import type { Knex } from 'knex';
import type { OrderView, SessionUser } from '../../src/domain/types';
import { isUniqueViolation } from '../db/rows';
import { HttpError, conflict, notFound } from '../errors';
import { CardDeclined } from '../payments/gateway';
import type { Deps } from './deps';
import { appendEvent, runCommand } from './events';
import { loadLocation } from './menu';
import { fireOrder } from './fire-order';
import { loadOrder } from './orders';
import { loadTicket } from './ticket-views';

async function startAttempt(deps: Deps, user: SessionUser, orderId: number) {
  return deps.db.transaction(async (trx) => {
    const order = await trx('orders').where({ id: orderId, location_id: user.locationId }).first();
    if (!order) throw notFound('Order');
    if (order.payment_status !== 'unpaid' || order.status !== 'pending') return null; // already settled
    const at = deps.clock().toISOString();
    try {
      const [{ id }] = await trx('payments')
        .insert({ order_id: orderId, method: 'card', status: 'processing', amount_cents: order.total_cents, created_at: at, updated_at: at })
        .returning('id');
      const location = await loadLocation(trx, user.locationId);
      const declines = await trx('payments').where({ order_id: orderId, status: 'declined' }).count<{ n: number }>({ n: '*' }).first();
      return {
        paymentId: id as number,
        amountCents: order.total_cents as number,
        currency: location.currency,
        declines: Number(declines?.n ?? 0),
      };
    } catch (err) {
      if (isUniqueViolation(err)) throw conflict('A card payment for this order is already in progress');
      throw err;
    }
  });
}

async function markAttempt(deps: Deps, paymentId: number, fields: Record<string, unknown>) {
  await deps.db('payments')
    .where({ id: paymentId, status: 'processing' })
    .update({ ...fields, updated_at: deps.clock().toISOString() });
}

export async function payByCard(deps: Deps, user: SessionUser, orderId: number, paymentMethod: string): Promise<OrderView> {
  if (!deps.payments) throw new HttpError(503, 'unavailable', 'Card payments are not set up here; take cash');
  const attempt = await startAttempt(deps, user, orderId);
  if (!attempt) return loadOrder(deps.db, orderId);
  let providerId: string;
  try {
    ({ providerId } = await deps.payments.chargeCard({
      amountCents: attempt.amountCents,
      currency: attempt.currency,
      paymentMethod,
      // Same order, same card, no decline in between: the same key. If an earlier try's answer was
      // lost, the provider replays its outcome instead of charging the card a second time.
      idempotencyKey: `jugline-order-${orderId}-${attempt.declines}-${paymentMethod}`,
      metadata: { orderId: String(orderId), paymentId: String(attempt.paymentId) },
    }));
  } catch (err) {
    if (err instanceof CardDeclined) {
      await markAttempt(deps, attempt.paymentId, {
        status: 'declined',
        provider_id: err.providerId,
        decline_code: err.declineCode ?? err.code,
        message: err.message.slice(0, 200),
      });
      throw new HttpError(402, 'payment_declined', `Card declined: ${err.message}`, {
        orderId,
        code: err.code,
        declineCode: err.declineCode,
      });
    }
    await markAttempt(deps, attempt.paymentId, { status: 'failed', message: String((err as Error).message).slice(0, 200) });
    throw new HttpError(502, 'payment_unavailable', 'The card service did not answer. Try the card again, or take cash.', { orderId });
  }
  return settleCardPayment(deps, attempt.paymentId, providerId);
}

/**
 * Record a succeeded card payment and fire its order. Safe to call twice (the API answer and the
 * webhook both do): only the first changes anything or publishes an event.
 */
export async function settleCardPayment(deps: Deps, paymentId: number, providerId: string): Promise<OrderView> {
  return runCommand(deps, async (trx: Knex.Transaction) => {
    const payment = await trx('payments').where({ id: paymentId }).first();
    if (!payment) throw notFound('Payment');
    const order = await trx('orders').where({ id: payment.order_id }).first();
    if (payment.status === 'succeeded' || order.status !== 'pending') {
      return { result: await loadOrder(trx, order.id), events: [] };
    }
    const at = deps.clock().toISOString();
    await trx('payments').where({ id: paymentId }).update({ status: 'succeeded', provider_id: providerId, updated_at: at });
    await fireOrder(trx, order.id, at);
    const ticket = await loadTicket(trx, order.id);
    const event = await appendEvent(trx, order.location_id, 'order.fired', ticket, at, null);
    return { result: await loadOrder(trx, order.id), events: [event] };
  });
}

/** The provider's word on a payment whose API answer we may have missed. */
export async function handlePaymentWebhook(deps: Deps, event: { type: string; data: { object: any } }) {
  const pi = event.data.object;
  const paymentId = Number(pi?.metadata?.paymentId);
  if (!Number.isInteger(paymentId) || paymentId <= 0) return;
  if (event.type === 'payment_intent.succeeded') {
    const payment = await deps.db('payments').where({ id: paymentId }).first('status');
    // money was taken: settle even an attempt we had marked failed after a lost answer
    if (payment && payment.status !== 'declined') await settleCardPayment(deps, paymentId, pi.id);
  } else if (event.type === 'payment_intent.payment_failed') {
    await markAttempt(deps, paymentId, { status: 'declined', provider_id: pi.id, decline_code: pi.last_payment_error?.decline_code ?? null });
  }
}
