// Menu items with their sizes and recipes. An item is saved whole (its sizes in order, its groups
// of extras); a size the form leaves out is retired, never deleted, since past orders point at it.
// Orders copy name and price when taken (order_items), so an edit never rewrites a past order.
import type { ItemBody, MoveBody, SizeInput } from '@/domain/menu-admin-schemas';
import { planSizeChanges } from '@/domain/menu-sizes';
import type { SessionUser } from '@/domain/types';
import { conflict, notFound } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { assertMenuOrderable, liveItems, menuCommand, moveRow, nextSort, ownedCategory, ownedItem, ownedRow, ownedSize, type Trx } from './admin-shared';

function sizeRow(s: SizeInput, sort: number) {
  return {
    name: s.name,
    volume_ml: s.volumeMl,
    cup: s.cup,
    price_cents: s.priceCents,
    shots: s.shots,
    dose_dg: s.doseDg,
    yield_dg: s.yieldDg,
    milk_ml: s.milkMl,
    is_default: s.isDefault,
    sort,
  };
}

function itemRow(body: ItemBody) {
  const recipe = body.sizes.find((s) => s.isDefault);
  return {
    category_id: body.categoryId,
    name: body.name,
    station: body.station,
    price_cents: body.sizes.length === 0 ? body.priceCents : null,
    shots: recipe?.shots ?? 0, // the default size's recipe, for anything that reads the item alone
    takes_milk: body.takesMilk,
    default_milk_id: body.defaultMilkId,
    texture: body.texture,
    ingredients: JSON.stringify(body.ingredients),
  };
}

/** The ids the body names must be this café's (404) and in use (409). */
async function checkReferences(trx: Trx, locationId: number, body: ItemBody, item: { id: number; retired: boolean } | null) {
  const category = await ownedCategory(trx, locationId, body.categoryId);
  if (category.retired_at) throw conflict(`The category ${category.name} is retired`);
  if (body.defaultMilkId !== null) {
    const milk = await ownedRow(trx, 'milk_options', locationId, body.defaultMilkId, 'Milk');
    if (milk.retired_at) throw conflict(`${milk.name} is retired`);
  }
  // a retired group keeps its links (a restore brings it back), so only a new link must be to a group in use
  const linked = item ? await trx('item_extra_groups').where({ item_id: item.id }).pluck('group_id') : [];
  for (const groupId of body.extraGroupIds) {
    const group = await ownedRow(trx, 'extra_groups', locationId, groupId, 'Group of extras');
    if (group.retired_at && !linked.includes(groupId)) throw conflict(`The group ${group.name} is retired`);
  }
  // a retired item may share a name with one on sale; restoring it is what would clash
  if (!item?.retired) await assertNameFree(trx, locationId, body.name, item?.id ?? null);
}

/** Two items of the same name on sale would be two identical tiles on the Counter. */
async function assertNameFree(trx: Trx, locationId: number, name: string, itemId: number | null) {
  const clash = await liveItems(trx, locationId)
    .whereRaw('lower(menu_items.name) = lower(?)', [name])
    .modify((q) => (itemId === null ? q : q.whereNot('menu_items.id', itemId)))
    .first('menu_items.id');
  if (clash) throw conflict(`There is already an item called ${name} on sale`);
}

async function setGroups(trx: Trx, itemId: number, groupIds: number[]) {
  await trx('item_extra_groups').where({ item_id: itemId }).delete();
  if (groupIds.length) await trx('item_extra_groups').insert(groupIds.map((group_id) => ({ item_id: itemId, group_id })));
}

export const createItem = (deps: Deps, user: SessionUser, body: ItemBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    await checkReferences(trx, locationId, body, null);
    const sort = await nextSort(trx('menu_items').where({ category_id: body.categoryId }));
    const [{ id }] = await trx('menu_items')
      .insert({ ...itemRow(body), available: true, sort })
      .returning('id');
    for (const [i, s] of body.sizes.entries()) await trx('item_sizes').insert({ ...sizeRow(s, i), item_id: id });
    await setGroups(trx, id, body.extraGroupIds);
    await assertMenuOrderable(trx, locationId);
    return id;
  });

export const updateItem = (deps: Deps, user: SessionUser, id: number, body: ItemBody) =>
  menuCommand(deps, user, async ({ trx, locationId, at }) => {
    const item = await ownedItem(trx, locationId, id);
    await checkReferences(trx, locationId, body, { id, retired: item.retired_at !== null });
    const stored = await trx('item_sizes').where({ item_id: id }).select('id', 'retired_at');
    const changes = planSizeChanges(
      stored.map((s) => ({ id: s.id, retired: s.retired_at !== null })),
      body.sizes,
    );
    if (changes.unknown.length) throw notFound('Size');
    if (body.sizes.length === 0 && changes.retire.length > 0) {
      throw conflict(`${item.name} has sizes: keep at least one, or retire the item`);
    }
    const moved = body.categoryId !== item.category_id;
    const sort = moved ? await nextSort(trx('menu_items').where({ category_id: body.categoryId })) : item.sort;
    await trx('menu_items')
      .where({ id })
      .update({ ...itemRow(body), sort });
    for (const keep of changes.keep) {
      await trx('item_sizes')
        .where({ id: keep.id })
        .update({ ...sizeRow(body.sizes[keep.sort], keep.sort), retired_at: null });
    }
    for (const place of changes.insert) await trx('item_sizes').insert({ ...sizeRow(body.sizes[place], place), item_id: id });
    if (changes.retire.length) await trx('item_sizes').whereIn('id', changes.retire).update({ retired_at: at, is_default: false });
    await setGroups(trx, id, body.extraGroupIds);
    await assertMenuOrderable(trx, locationId);
    return id;
  });

export const retireItem = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId, at }) => {
    const item = await ownedItem(trx, locationId, id);
    if (item.retired_at) throw conflict(`${item.name} is already retired`);
    await trx('menu_items').where({ id }).update({ retired_at: at });
    return id;
  });

export const restoreItem = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const item = await ownedItem(trx, locationId, id);
    if (!item.retired_at) throw conflict(`${item.name} is on the menu`);
    const category = await ownedCategory(trx, locationId, item.category_id);
    if (category.retired_at) throw conflict(`Its category ${category.name} is retired: restore the category first`);
    await assertNameFree(trx, locationId, item.name, id);
    // back in its old place: cashiers know the tiles (and their 1–9 keys) by position
    await trx('menu_items').where({ id }).update({ retired_at: null });
    await assertMenuOrderable(trx, locationId);
    return id;
  });

export const moveItem = (deps: Deps, user: SessionUser, id: number, { direction }: MoveBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const item = await ownedItem(trx, locationId, id);
    if (item.retired_at) throw conflict('Restore it before moving it');
    const siblings = await trx('menu_items').where({ category_id: item.category_id }).whereNull('retired_at').orderBy(['sort', 'id']).pluck('id');
    await moveRow(trx, 'menu_items', siblings, id, direction);
    return id;
  });

/** Retire one size. The default size and an item's last size stay: the Counter needs them. */
export const retireSize = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId, at }) => {
    const size = await ownedSize(trx, locationId, id);
    if (size.retired_at) throw conflict(`${size.name} is already retired`);
    const live = await trx('item_sizes').where({ item_id: size.item_id }).whereNull('retired_at').count<{ n: number }>({ n: '*' }).first();
    if (Number(live?.n) <= 1) throw conflict(`${size.name} is the item's last size: retire the item instead`);
    if (size.is_default) throw conflict(`${size.name} is the default size: make another size the default first`);
    await trx('item_sizes').where({ id }).update({ retired_at: at });
    return size.item_id;
  });

export const restoreSize = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const size = await ownedSize(trx, locationId, id);
    if (!size.retired_at) throw conflict(`${size.name} is in use`);
    const item = await ownedItem(trx, locationId, size.item_id);
    const clash = await trx('item_sizes').where({ item_id: size.item_id }).whereNull('retired_at').whereRaw('lower(name) = lower(?)', [size.name]).first('id');
    if (clash) throw conflict(`${item.name} already has a size called ${size.name}`);
    const takesMilk = item.takes_milk === 1 || item.takes_milk === true;
    if (takesMilk !== size.milk_ml > 0) throw conflict(`Its recipe no longer fits ${item.name}'s milk: add the size again instead`);
    const sort = await nextSort(trx('item_sizes').where({ item_id: size.item_id }).whereNull('retired_at'));
    await trx('item_sizes').where({ id }).update({ retired_at: null, is_default: false, sort });
    return size.item_id;
  });
