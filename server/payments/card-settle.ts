// What the card service says about a charge, applied to Jugline: every charge it made for an
// order ends either recorded against that order or given back by Jugline itself, with a refund
// row saying why (the order was voided, paid another way, or paid by another card). The API
// answer, the webhook, the next attempt at the Counter, a void and the lead's card check all come
// through here, possibly at the same moment for the same attempt: each decision is one
// transaction that re-reads the attempt, so the first decides and the rest find it done.
import { AUTO_REFUND_REASON, autoRefundCause, type AutoRefundCause } from '@/domain/card-check';
import { amountDueCents } from '@/domain/tips';
import { GatewayRefused, GatewayUnavailable, type ChargeState, type PaymentGateway } from './gateway';
import { lockingRead } from '@server/db/dialect';
import type { Deps } from '@server/deps';
import { appendEvent, runCommand } from '@server/events';
import { fireIfPaid, paidParts, paidSum } from '@server/orders/settle';
import { loadTicket } from '@server/tickets/ticket-views';

/** Longer than the SDK's three tries with their timeouts: a "processing" attempt this old was cut off. */
export const STALE_PROCESSING_MS = 2 * 60_000;

interface GiveBack {
  refundId: number;
  paymentId: number;
  orderId: number;
  chargeId: string;
  amountCents: number;
  cause: AutoRefundCause;
}

function gatewayOf(deps: Deps): PaymentGateway {
  if (!deps.payments) throw new GatewayUnavailable('Card payments are not set up here');
  return deps.payments;
}

const nowIso = (deps: Deps) => deps.clock().toISOString();

/** Mark an attempt, only if it is still in one of `from` (another path may have settled it). */
export async function markAttempt(deps: Deps, paymentId: number, from: string[], fields: Record<string, unknown>) {
  return deps
    .db('payments')
    .where({ id: paymentId })
    .whereIn('status', from)
    .update({ ...fields, updated_at: nowIso(deps) });
}

/** The refund row and the attempt, once the card service has given the money back. */
async function recordGivenBack(deps: Deps, r: GiveBack, refundProviderId: string) {
  await deps.db.transaction(async (trx) => {
    await trx('refunds').where({ id: r.refundId }).whereNull('provider_id').update({ provider_id: refundProviderId });
    await trx('payments')
      .where({ id: r.paymentId, status: 'refunding' })
      .update({ status: 'refunded', updated_at: nowIso(deps) });
  });
}

/** Ask the card service to give the charge back; the key makes a repeat the same refund. */
async function giveBack(deps: Deps, r: GiveBack) {
  const { providerId } = await gatewayOf(deps).refund({
    providerId: r.chargeId,
    amountCents: r.amountCents,
    idempotencyKey: `jugline-auto-refund-${r.paymentId}`,
    reason: AUTO_REFUND_REASON[r.cause],
    providerReason: r.cause === 'order_voided' ? 'requested_by_customer' : 'duplicate',
    metadata: { orderId: String(r.orderId), paymentId: String(r.paymentId), cause: r.cause },
  });
  await recordGivenBack(deps, r, providerId);
}

/**
 * A charge that succeeded at the card service: record it against its order if the order is still
 * waiting for its money (and fire it to the bar), else give it back.
 */
async function settleCharge(deps: Deps, paymentId: number, state: ChargeState) {
  const refund = await runCommand<GiveBack | null>(deps, async (trx) => {
    // The order's row first (every command on an order's money holds it in that order), then the
    // attempt read again: the API answer and the webhook settling it at once take turns here.
    const orderId = (await trx('payments').where({ id: paymentId }).first('order_id'))?.order_id;
    if (orderId !== undefined) await lockingRead(trx, trx('orders').where({ id: orderId })).first('id');
    const p = await trx('payments').where({ id: paymentId }).first();
    if (!p || p.method !== 'card' || p.status === 'succeeded' || p.status === 'refunded') return { result: null, events: [] };
    const pending = (row: { id: number; cause: AutoRefundCause }): GiveBack => ({
      refundId: row.id,
      paymentId,
      orderId: p.order_id,
      chargeId: state.providerId,
      amountCents: state.receivedCents,
      cause: row.cause,
    });
    if (p.status === 'refunding') {
      // decided before; the card service's answer to the refund never came
      return { result: pending(await trx('refunds').where({ payment_id: paymentId }).whereNotNull('cause').first('id', 'cause')), events: [] };
    }
    const order = await trx('orders').where({ id: p.order_id }).first();
    const at = nowIso(deps);
    const paid = await paidParts(trx, order.id);
    const left = amountDueCents(order.total_cents, order.tip_cents) - paidSum(paid);
    const takes = order.status === 'pending' && order.payment_status === 'unpaid' && !paid.some((q) => q.part === p.part) && p.amount_cents <= left;
    if (takes) {
      await trx('payments').where({ id: paymentId }).update({ status: 'succeeded', provider_id: state.providerId, updated_at: at });
      // the order goes to the bar once its last part is in (a split may still wait for another)
      if (!(await fireIfPaid(trx, order, at))) return { result: null, events: [] };
      const event = await appendEvent(trx, order.location_id, 'order.fired', await loadTicket(trx, order.id), at, null);
      return { result: null, events: [event] };
    }
    // The order can't take this money. The ticket doesn't change, so no event goes to the screens;
    // the refund row is the record, and the card check shows it.
    // paid already: this part by another card or in cash, or the order as a whole
    const paidBy = paid.find((q) => q.part === p.part) ?? paid[0];
    const cause = autoRefundCause(paidBy?.method ?? null);
    await trx('payments').where({ id: paymentId }).update({ status: 'refunding', provider_id: state.providerId, updated_at: at });
    const [{ id }] = await trx('refunds')
      .insert({
        order_id: order.id,
        payment_id: paymentId,
        amount_cents: state.receivedCents,
        reason: AUTO_REFUND_REASON[cause],
        cause,
        provider_id: null,
        created_by: null,
        created_at: at,
      })
      .returning('id');
    return { result: pending({ id, cause }), events: [] };
  });
  if (refund) await giveBack(deps, refund);
}

/**
 * Apply the card service's word on one attempt. Safe to repeat and to run from several paths at
 * once. Throws GatewayUnavailable when the card service can't be asked (or is still working).
 */
export async function applyChargeState(deps: Deps, paymentId: number, state: ChargeState | null): Promise<void> {
  if (!state) {
    await markAttempt(deps, paymentId, ['unknown'], { status: 'failed', message: 'The card service has no such charge' });
    return;
  }
  switch (state.status) {
    case 'succeeded':
      return settleCharge(deps, paymentId, state);
    case 'declined':
      await markAttempt(deps, paymentId, ['processing', 'unknown'], { status: 'declined', provider_id: state.providerId, decline_code: state.declineCode });
      return;
    case 'canceled':
      await markAttempt(deps, paymentId, ['unknown'], { status: 'failed', message: 'Canceled at the card service' });
      return;
    case 'open': {
      // Never run. Cancel it, so that nothing can take money on it later, and close the attempt.
      const p = await deps.db('payments').where({ id: paymentId }).first('status');
      if (p?.status !== 'unknown') return;
      try {
        await gatewayOf(deps).cancel(state.providerId);
      } catch (err) {
        if (!(err instanceof GatewayRefused)) throw err;
        // it was run after all, between our look and the cancel: look again (once)
        const now = await gatewayOf(deps).lookupCharge(state.providerId);
        if (now?.status === 'open') throw err;
        return applyChargeState(deps, paymentId, now);
      }
      await markAttempt(deps, paymentId, ['unknown'], { status: 'failed', message: 'Never run; canceled at the card service' });
      return;
    }
    case 'pending':
      throw new GatewayUnavailable('The card service is still working on this charge');
  }
}

/** Ask the card service about one attempt and apply its answer. */
async function settleAttempt(deps: Deps, p: { id: number; provider_id: string | null }) {
  if (!p.provider_id) {
    // Jugline never learned the charge's id, so it never asked for the card to be run: no money moved.
    await markAttempt(deps, p.id, ['unknown'], { status: 'failed', message: 'The card was never run' });
    return;
  }
  await applyChargeState(deps, p.id, await gatewayOf(deps).lookupCharge(p.provider_id));
}

/** An attempt still "processing" long after any call could take was cut off (a restart mid-call): its outcome is unknown. */
export async function releaseStaleAttempts(deps: Deps, orderId: number) {
  const cutoff = new Date(deps.clock().getTime() - STALE_PROCESSING_MS).toISOString();
  await deps
    .db('payments')
    .where({ order_id: orderId, method: 'card', status: 'processing' })
    .andWhere('updated_at', '<', cutoff)
    .update({ status: 'unknown', updated_at: nowIso(deps) });
}

/**
 * Before anything else is done about an order's money: ask the card service what became of each
 * of its attempts whose outcome Jugline never heard (or whose automatic refund isn't confirmed),
 * and apply it. Answers false when some of them are still unknown (the card service didn't answer).
 */
export async function settleOpenAttempts(deps: Deps, orderId: number): Promise<boolean> {
  if (!deps.payments) return true;
  await releaseStaleAttempts(deps, orderId);
  const open = await deps
    .db('payments')
    .where({ order_id: orderId, method: 'card' })
    .whereIn('status', ['unknown', 'refunding'])
    .orderBy('id')
    .select('id', 'provider_id');
  let known = true;
  for (const p of open) {
    try {
      await settleAttempt(deps, p);
    } catch (err) {
      if (!(err instanceof GatewayUnavailable || err instanceof GatewayRefused)) throw err;
      known = false;
    }
  }
  return known;
}

/**
 * The card service's webhook. The event may be old, repeated or out of order, so Jugline acts on
 * the charge as the card service has it now; when it can't be asked, this throws
 * GatewayUnavailable and the route answers 503, so the event is sent again later.
 */
export async function handlePaymentWebhook(deps: Deps, event: { type: string; data: { object: unknown } }) {
  if (!event.type.startsWith('payment_intent.')) return; // refunds and charges: the card check covers them
  const pi = event.data.object as { id?: unknown; metadata?: Record<string, string> } | null;
  const paymentId = Number(pi?.metadata?.paymentId);
  if (typeof pi?.id !== 'string' || !Number.isInteger(paymentId) || paymentId <= 0) return;
  const payment = await deps.db('payments').where({ id: paymentId, method: 'card' }).first('id', 'provider_id');
  if (!payment || (payment.provider_id && payment.provider_id !== pi.id)) return;
  let state: ChargeState | null;
  try {
    state = await gatewayOf(deps).lookupCharge(pi.id);
  } catch (err) {
    if (err instanceof GatewayRefused) return; // the card service won't say: asking again won't help
    throw err;
  }
  if (!state || state.metadata.paymentId !== String(paymentId)) return; // not one of ours
  await applyChargeState(deps, paymentId, state);
}
