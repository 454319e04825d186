// How an order is settled, in one place: paid in cash at the till, by a card charge that succeeds
// (now or when its late answer arrives), or in cash after a declined card. Settling fires it: an
// order with bar drinks goes to the Bar (open); an order of counter items only is collected at
// the till at once (collected, and ready at the same moment).
import { paidColumns, type PaidPart } from '@/domain/split-payment';
import { amountDueCents } from '@/domain/tips';
import { invalid } from '@server/domain-errors';
import type { Db } from '@server/db/knex';
import type { Row } from '@server/db/tables';

/** The order's columns once it is paid and fired at `at`. */
export function settledColumns(hasBarDrinks: boolean, at: string) {
  return {
    payment_status: 'paid' as const,
    status: hasBarDrinks ? ('open' as const) : ('collected' as const),
    fired_at: at,
    ready_at: hasBarDrinks ? null : at,
    collected_at: hasBarDrinks ? null : at,
  };
}

/** Refuses cash that doesn't cover the amount due, the tip included (400, on the tendered field). */
export function requireEnoughCash(dueCents: number, tenderedCents: number): void {
  if (tenderedCents < dueCents) {
    throw invalid('The cash tendered is less than the amount due', [{ path: 'payment.tenderedCents', message: `At least ${dueCents} cents are due` }]);
  }
}

/** The columns that say how an order was paid in cash; `dueCents` is the total and the tip. */
export const cashColumns = (dueCents: number, tenderedCents: number) => ({
  payment_method: 'cash' as const,
  tendered_cents: tenderedCents,
  change_cents: tenderedCents - dueCents,
});

/** The succeeded payment row of cash taken at `at`: the amount is the total and the tip (or one part of them). */
export const cashPayment = (orderId: number, dueCents: number, tenderedCents: number, at: string, part = 1) => ({
  order_id: orderId,
  part,
  method: 'cash',
  status: 'succeeded',
  amount_cents: dueCents,
  tendered_cents: tenderedCents,
  change_cents: tenderedCents - dueCents,
  created_at: at,
  updated_at: at,
});

/** Settle a waiting order (its payment arrived) and fire it. */
export async function fireOrder(trx: Db, orderId: number, at: string, fields: Record<string, unknown> = {}) {
  const hasBar = await trx('order_items').where({ order_id: orderId, station: 'bar' }).first('id');
  await trx('orders')
    .where({ id: orderId })
    .update({ ...fields, ...settledColumns(Boolean(hasBar), at) });
}

/** The order's paid parts, the first first, each with what has been given back of it (one query). */
export async function paidParts(trx: Db, orderId: number): Promise<PaidPart[]> {
  return (await paidPartRows(trx, orderId)).map(({ providerId: _, ...part }) => part);
}

/** The paid parts with each card's charge id at the card service. */
export async function paidPartRows(trx: Db, orderId: number): Promise<(PaidPart & { providerId: string | null })[]> {
  const rows = await trx('payments as p')
    .where({ 'p.order_id': orderId, 'p.status': 'succeeded' })
    .orderBy('p.part')
    .select('p.id', 'p.part', 'p.method', 'p.amount_cents', 'p.tendered_cents', 'p.change_cents', 'p.provider_id')
    .select(trx.raw('(SELECT COALESCE(SUM(r.amount_cents), 0) FROM refunds r WHERE r.payment_id = p.id) AS refunded'));
  return rows.map((r) => ({ ...paidPartOf(r, Number(r.refunded)), providerId: r.provider_id }));
}

/** A succeeded payment row as a paid part, given what has been refunded of it. */
export function paidPartOf(
  r: Pick<Row<'payments'>, 'id' | 'part' | 'method' | 'amount_cents' | 'tendered_cents' | 'change_cents'>,
  refundedCents: number,
): PaidPart {
  return {
    paymentId: r.id,
    part: r.part,
    method: r.method,
    amountCents: r.amount_cents,
    tenderedCents: r.tendered_cents,
    changeCents: r.change_cents,
    refundedCents,
  };
}

export const paidSum = (paid: readonly { amountCents: number }[]) => paid.reduce((sum, p) => sum + p.amountCents, 0);

/**
 * Once the order's parts cover everything due (total and tip): settle it and fire it. Answers true
 * when it fired. Called holding the order's row, after a part was recorded.
 */
export async function fireIfPaid(trx: Db, order: { id: number; total_cents: number; tip_cents: number }, at: string): Promise<boolean> {
  const paid = await paidParts(trx, order.id);
  if (paidSum(paid) < amountDueCents(order.total_cents, order.tip_cents)) return false;
  await fireOrder(trx, order.id, at, paidColumns(paid));
  return true;
}
