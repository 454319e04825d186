// Paying an order in parts. The parts are taken one after another in the order listed: a cash part
// is recorded at once (the cashier has the money in hand), a card part is run as any card is
// (card-payments.ts). The order waits, unfired, until its parts cover everything due; a part
// already paid is never taken again, so after a declined card the Counter sends the same list with
// another card (or cash) in that part's place. Each part is its own payment row, refundable alone.
import type { PaymentPart } from '@/domain/schemas';
import { splitDifference } from '@/domain/split-payment';
import { amountDueCents } from '@/domain/tips';
import type { OrderView, SessionUser } from '@/domain/types';
import { lockingRead } from '@server/db/dialect';
import type { Deps } from '@server/deps';
import { conflict, DomainError, invalid, notFound, upstreamFailed } from '@server/domain-errors';
import { appendEvent, runCommand } from '@server/events';
import { payByCard } from '@server/payments/card-payments';
import { settleOpenAttempts } from '@server/payments/card-settle';
import { loadTicket } from '@server/tickets/ticket-views';
import { loadOrder } from './order-views';
import { cashPayment, fireIfPaid, paidParts, paidSum } from './settle';

/** Refuses a list of parts that doesn't add up to the amount due (400, on the parts). */
export function requirePartsCover(parts: readonly PaymentPart[], dueCents: number): void {
  const difference = splitDifference(parts, dueCents);
  if (difference !== 0) {
    throw invalid(difference > 0 ? 'The parts come to more than the amount due' : 'The parts come to less than the amount due', [
      { path: 'payment.parts', message: `The parts must add up to ${dueCents} cents (the total and the tip)` },
    ]);
  }
}

const partWords = (p: { method: string; amountCents: number }) => `${p.method} ${p.amountCents} cents`;

/** The parts sent must agree with what the order was paid already: a paid part can't change. */
async function checkAgainstPaid(deps: Deps, user: SessionUser, orderId: number, parts: readonly PaymentPart[]) {
  const order = await deps.db('orders').where({ id: orderId, location_id: user.locationId }).first();
  if (!order) throw notFound('Order');
  // money given back from a part of this order: its parts no longer say what was paid
  if (order.refunded_cents > 0) throw conflict('Money was given back on this order; take it again as a new order', { orderId });
  requirePartsCover(parts, amountDueCents(order.total_cents, order.tip_cents));
  for (const paid of await paidParts(deps.db, orderId)) {
    const listed = parts[paid.part - 1];
    if (!listed || listed.method !== paid.method || listed.amountCents !== paid.amountCents) {
      throw conflict(`Part ${paid.part} was paid already (${partWords(paid)}); send it again as it was`, { orderId, part: paid.part });
    }
  }
}

/** Record one cash part; fire the order if it was the last one missing. */
async function payCashPart(deps: Deps, user: SessionUser, orderId: number, part: number, amountCents: number, tenderedCents: number) {
  await runCommand(deps, async (trx) => {
    const order = await lockingRead(trx, trx('orders').where({ id: orderId, location_id: user.locationId })).first();
    if (order.status !== 'pending' || order.payment_status !== 'unpaid') return { result: null, events: [] };
    const paid = await paidParts(trx, orderId);
    if (paid.some((p) => p.part === part)) return { result: null, events: [] }; // a send that raced this one took it
    const left = amountDueCents(order.total_cents, order.tip_cents) - paidSum(paid);
    if (amountCents > left) throw conflict(`Part ${part} is more than is left to pay (${left} cents)`, { orderId, part });
    const at = deps.clock().toISOString();
    await trx('payments').insert(cashPayment(orderId, amountCents, tenderedCents, at, part));
    if (!(await fireIfPaid(trx, order, at))) return { result: null, events: [] }; // the ticket is unchanged until it fires
    const event = await appendEvent(trx, user.locationId, 'order.fired', await loadTicket(trx, orderId), at, user.id);
    return { result: null, events: [event] };
  });
}

/** Take each part not yet paid, in order. A refused card stops there and says which part it was. */
export async function payInParts(deps: Deps, user: SessionUser, orderId: number, parts: readonly PaymentPart[]): Promise<OrderView> {
  // a card whose answer was lost may have paid a part: known before anything else is taken
  if (!(await settleOpenAttempts(deps, orderId))) {
    throw upstreamFailed("The card service isn't answering, so whether the last card was charged isn't known yet. Try again in a moment.", { orderId });
  }
  await checkAgainstPaid(deps, user, orderId, parts);
  for (const [i, p] of parts.entries()) {
    const part = i + 1;
    try {
      if (p.method === 'cash') await payCashPart(deps, user, orderId, part, p.amountCents, p.tenderedCents);
      else await payByCard(deps, user, orderId, p.paymentMethod, { part, amountCents: p.amountCents });
    } catch (err) {
      if (!(err instanceof DomainError)) throw err;
      const paid = (await paidParts(deps.db, orderId)).map((q) => q.part);
      const message = `Part ${part} of ${parts.length}: ${err.message}${paid.length ? ` (part ${paid.join(' and ')} paid)` : ''}`;
      throw new DomainError(err.refusal, err.code, message, { ...(err.details as object), orderId, part, paidParts: paid });
    }
  }
  return loadOrder(deps.db, orderId);
}
