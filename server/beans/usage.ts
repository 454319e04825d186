// Coffee taken from the grinders by the bar. Written inside the bump's own transaction, so a
// bump and its coffee commit together, and a recall takes both back.
import type { Knex } from 'knex';
import { drinkHopper } from '@/domain/bean-stock';
import { json } from '@server/db/rows';

/** One usage row per bumped drink with a dose, from the lot in the grinder it was made from. */
export async function recordCoffeeUse(trx: Knex.Transaction, locationId: number, drinkIds: number[], at: string): Promise<void> {
  if (drinkIds.length === 0) return;
  const drinks = await trx('order_items').whereIn('id', drinkIds).andWhere('dose_dg', '>', 0).select('id', 'dose_dg', 'extras');
  if (drinks.length === 0) return;
  const lots = await trx('bean_lots')
    .where({ location_id: locationId })
    .whereNull('retired_at')
    .whereIn('hopper', ['espresso', 'decaf'])
    .select('id', 'hopper');
  const rows = drinks.flatMap((d) => {
    const names = json<{ name: string }[]>(d.extras, []).map((m) => m.name);
    const lot = lots.find((l) => l.hopper === drinkHopper(names));
    // no lot in that grinder: the coffee isn't tracked (never charged to the other grinder's lot)
    return lot ? [{ lot_id: lot.id, source: 'drink', order_item_id: d.id, dose_dg: d.dose_dg, used_at: at }] : [];
  });
  if (rows.length) await trx('bean_usage').insert(rows);
}

/** A recall undoes a bump: the coffee of the drinks that bump finished goes back to its lot. */
export async function returnCoffeeUse(trx: Knex.Transaction, orderId: number, bumpSeq: number): Promise<void> {
  const drinks = trx('order_items').where({ order_id: orderId, bump_seq: bumpSeq }).select('id');
  await trx('bean_usage').where({ source: 'drink' }).whereIn('order_item_id', drinks).del();
}
