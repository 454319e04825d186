// 86 an item (and bring it back). The Counter greys it out at once through the live event.
import type { SessionUser } from '@/domain/types';
import { notFound } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { appendMenuEvent, runCommand } from '@server/events';

export function setItemAvailability(deps: Deps, user: SessionUser, itemId: number, available: boolean) {
  return runCommand(deps, async (trx) => {
    const item = await trx('menu_items')
      .join('menu_categories', 'menu_categories.id', 'menu_items.category_id')
      .where({ 'menu_items.id': itemId, 'menu_categories.location_id': user.locationId })
      .first('menu_items.id');
    if (!item) throw notFound('Menu item');
    await trx('menu_items').where({ id: itemId }).update({ available });
    const event = await appendMenuEvent(trx, user.locationId, { id: itemId, available }, deps.clock().toISOString(), user.id);
    return { result: { id: itemId, available }, events: [event] };
  });
}
