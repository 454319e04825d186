// A paid order goes to the bar; an order of counter items only is collected at the till.
import type { Knex } from 'knex';

export async function fireOrder(trx: Knex.Transaction, orderId: number, at: string, fields: Record<string, unknown> = {}) {
  const hasBar = await trx('order_items').where({ order_id: orderId, station: 'bar' }).first('id');
  await trx('orders')
    .where({ id: orderId })
    .update({
      ...fields,
      payment_status: 'paid',
      status: hasBar ? 'open' : 'collected',
      fired_at: at,
      ready_at: hasBar ? null : at,
      collected_at: hasBar ? null : at,
    });
}
