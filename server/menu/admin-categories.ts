// Menu categories: the Counter's tabs.
import type { CategoryBody, MoveBody } from '@/domain/menu-admin-schemas';
import type { SessionUser } from '@/domain/types';
import { conflict } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { menuCommand, moveRow, nextSort, ownedCategory } from './admin-shared';

export const createCategory = (deps: Deps, user: SessionUser, body: CategoryBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const sort = await nextSort(trx('menu_categories').where({ location_id: locationId }));
    const [{ id }] = await trx('menu_categories').insert({ location_id: locationId, name: body.name, sort }).returning('id');
    return id;
  });

export const updateCategory = (deps: Deps, user: SessionUser, id: number, body: CategoryBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    await ownedCategory(trx, locationId, id);
    await trx('menu_categories').where({ id }).update({ name: body.name });
    return id;
  });

/** A category still holding items on sale can't go: its items would vanish with it. */
export const retireCategory = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId, at }) => {
    const category = await ownedCategory(trx, locationId, id);
    if (category.retired_at) throw conflict(`${category.name} is already retired`);
    const live = await trx('menu_items').where({ category_id: id }).whereNull('retired_at').count<{ n: number }>({ n: '*' }).first();
    const n = Number(live?.n ?? 0);
    if (n > 0) throw conflict(`${category.name} still has ${n} item${n === 1 ? '' : 's'} on sale: move or retire ${n === 1 ? 'it' : 'them'} first`);
    await trx('menu_categories').where({ id }).update({ retired_at: at });
    return id;
  });

export const restoreCategory = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const category = await ownedCategory(trx, locationId, id);
    if (!category.retired_at) throw conflict(`${category.name} is in use`);
    const sort = await nextSort(trx('menu_categories').where({ location_id: locationId }));
    await trx('menu_categories').where({ id }).update({ retired_at: null, sort });
    return id;
  });

export const moveCategory = (deps: Deps, user: SessionUser, id: number, { direction }: MoveBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const category = await ownedCategory(trx, locationId, id);
    if (category.retired_at) throw conflict('Restore it before moving it');
    const siblings = await trx('menu_categories').where({ location_id: locationId }).whereNull('retired_at').orderBy(['sort', 'id']).pluck('id');
    await moveRow(trx, 'menu_categories', siblings, id, direction);
    return id;
  });
