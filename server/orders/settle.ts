// How an order is settled, in one place: paid in cash at the till, by a card charge that succeeds
// (now or when its late answer arrives), or in cash after a declined card. Settling fires it: an
// order with bar drinks goes to the Bar (open); an order of counter items only is collected at
// the till at once (collected, and ready at the same moment).
import { invalid } from '@server/domain-errors';
import type { Db } from '@server/db/knex';

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

/** The succeeded payment row of cash taken at `at`: the amount is the total and the tip. */
export const cashPayment = (orderId: number, dueCents: number, tenderedCents: number, at: string) => ({
  order_id: orderId,
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
