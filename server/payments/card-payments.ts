// Card payments. An attempt is recorded as "processing" before the card service is asked, and a
// unique index allows one live attempt per order. The charge is created first and its id stored,
// then the card is run, each call under a key fixed for the attempt, so the SDK's own retries
// replay rather than charge again. When the answer to running the card is lost, the attempt is
// "unknown" until the card service says what happened (its webhook, or Jugline asking before the
// order's money is touched again: the next card, cash or a void). The order is fired to the bar
// only once its payment has succeeded.
import type { OrderView, SessionUser } from '@/domain/types';
import { amountDueCents } from '@/domain/tips';
import { lockingRead } from '@server/db/dialect';
import { isUniqueViolation } from '@server/db/rows';
import { conflict, declined, notFound, notSetUp, upstreamFailed } from '@server/domain-errors';
import { CardDeclined, GatewayRefused, type ChargeState } from './gateway';
import { applyChargeState, markAttempt, settleOpenAttempts } from './card-settle';
import type { Deps } from '@server/deps';
import { loadLocation } from '@server/menu/menu';
import { loadOrder } from '@server/orders/order-views';
import { paidParts, paidSum } from '@server/orders/settle';

/** One part of a split order: its number and amount. Left out, the card pays the whole amount due as part 1. */
export interface CardPart {
  part: number;
  amountCents: number;
}

async function startAttempt(deps: Deps, user: SessionUser, orderId: number, part: CardPart | undefined) {
  return deps.db.transaction(async (trx) => {
    const order = await lockingRead(trx, trx('orders').where({ id: orderId, location_id: user.locationId })).first();
    if (!order) throw notFound('Order');
    if (order.payment_status !== 'unpaid' || order.status !== 'pending') return null; // already settled
    const paid = await paidParts(trx, orderId);
    if (paid.some((p) => p.part === (part?.part ?? 1))) return null; // this part is paid
    const left = amountDueCents(order.total_cents, order.tip_cents) - paidSum(paid); // the tip is charged with the order
    const amount = part?.amountCents ?? left;
    if (amount > left) throw conflict(`This part is more than is left to pay (${left} cents)`, { orderId });
    const at = deps.clock().toISOString();
    try {
      const [{ id }] = await trx('payments')
        .insert({ order_id: orderId, part: part?.part ?? 1, method: 'card', status: 'processing', amount_cents: amount, created_at: at, updated_at: at })
        .returning('id');
      const location = await loadLocation(trx, user.locationId);
      return { paymentId: id as number, amountCents: amount, currency: location.currency };
    } catch (err) {
      if (isUniqueViolation(err)) throw conflict('A card payment for this order is in progress');
      throw err;
    }
  });
}

const unavailable = (orderId: number, message: string) => upstreamFailed(message, { orderId });
const messageOf = (err: unknown) => String((err as Error)?.message ?? err).slice(0, 200);

export async function payByCard(deps: Deps, user: SessionUser, orderId: number, paymentMethod: string, part?: CardPart): Promise<OrderView> {
  const gateway = deps.payments;
  if (!gateway) throw notSetUp('Card payments are not set up here; take cash');
  // Never run a card while an earlier one's outcome is unknown: it may have been charged.
  if (!(await settleOpenAttempts(deps, orderId))) {
    throw unavailable(orderId, "The card service isn't answering, so whether the last card was charged isn't known yet. Try again in a moment, or take cash.");
  }
  const attempt = await startAttempt(deps, user, orderId, part);
  if (!attempt) return loadOrder(deps.db, orderId);
  const key = `jugline-payment-${attempt.paymentId}`;

  let providerId: string;
  try {
    ({ providerId } = await gateway.createCharge({
      amountCents: attempt.amountCents,
      currency: attempt.currency,
      paymentMethod,
      idempotencyKey: key,
      metadata: { orderId: String(orderId), paymentId: String(attempt.paymentId), locationId: String(user.locationId) },
    }));
  } catch (err) {
    // The card was not run: nothing can have been charged.
    await markAttempt(deps, attempt.paymentId, ['processing'], { status: 'failed', message: messageOf(err) });
    if (err instanceof GatewayRefused) throw conflict(`The card service refused the payment: ${err.message}`, { orderId });
    throw unavailable(orderId, 'The card service did not answer, and the card was not charged. Try the card again, or take cash.');
  }
  await markAttempt(deps, attempt.paymentId, ['processing'], { provider_id: providerId });

  let state: ChargeState;
  try {
    state = await gateway.confirmCharge({ providerId, idempotencyKey: `${key}-confirm` });
  } catch (err) {
    if (err instanceof CardDeclined) {
      await markAttempt(deps, attempt.paymentId, ['processing'], {
        status: 'declined',
        decline_code: err.declineCode ?? err.code,
        message: err.message.slice(0, 200),
      });
      throw declined(`Card declined: ${err.message}`, { orderId, code: err.code, declineCode: err.declineCode });
    }
    // The answer was lost: the card may or may not have been charged.
    await markAttempt(deps, attempt.paymentId, ['processing'], { status: 'unknown', message: messageOf(err) });
    // The card service answers other calls: ask it now.
    if (err instanceof GatewayRefused) await settleOpenAttempts(deps, orderId);
    const order = await loadOrder(deps.db, orderId);
    if (order.paymentStatus !== 'unpaid') return order; // its webhook came meanwhile
    throw unavailable(orderId, 'The card service did not answer. Jugline asks it what happened before the card is tried again: send again, or take cash.');
  }
  await applyChargeState(deps, attempt.paymentId, state);
  return loadOrder(deps.db, orderId);
}
