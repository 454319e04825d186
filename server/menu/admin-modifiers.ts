// Groups of extras (single or multiple choice, required or not, on which items) and the extras
// in them. Orders copy an extra's name and price when taken, so edits never reach past orders.
import type { ModifierBody, ModifierGroupBody, MoveBody } from '@/domain/menu-admin-schemas';
import type { SessionUser } from '@/domain/types';
import { conflict } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { assertMenuOrderable, menuCommand, moveRow, nextSort, ownedItem, ownedRow, type Trx } from './admin-shared';

async function setItems(trx: Trx, locationId: number, groupId: number, itemIds: number[]) {
  for (const itemId of itemIds) await ownedItem(trx, locationId, itemId);
  await trx('item_modifier_groups').where({ group_id: groupId }).delete();
  if (itemIds.length) await trx('item_modifier_groups').insert(itemIds.map((item_id) => ({ item_id, group_id: groupId })));
}

const groupRow = (b: ModifierGroupBody) => ({ name: b.name, selection: b.selection, required: b.required });

export const createGroup = (deps: Deps, user: SessionUser, body: ModifierGroupBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const sort = await nextSort(trx('modifier_groups').where({ location_id: locationId }));
    const [{ id }] = await trx('modifier_groups')
      .insert({ ...groupRow(body), location_id: locationId, sort })
      .returning('id');
    await setItems(trx, locationId, id, body.itemIds);
    await assertMenuOrderable(trx, locationId);
    return id;
  });

export const updateGroup = (deps: Deps, user: SessionUser, id: number, body: ModifierGroupBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    await ownedRow(trx, 'modifier_groups', locationId, id, 'Group of extras');
    await trx('modifier_groups').where({ id }).update(groupRow(body));
    await setItems(trx, locationId, id, body.itemIds);
    await assertMenuOrderable(trx, locationId);
    return id;
  });

/** Retired, a group leaves every item's sheet; its links stay so a restore brings it back. */
export const retireGroup = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId, at }) => {
    const group = await ownedRow(trx, 'modifier_groups', locationId, id, 'Group of extras');
    if (group.retired_at) throw conflict(`${group.name} is already retired`);
    await trx('modifier_groups').where({ id }).update({ retired_at: at });
    return id;
  });

export const restoreGroup = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const group = await ownedRow(trx, 'modifier_groups', locationId, id, 'Group of extras');
    if (!group.retired_at) throw conflict(`${group.name} is in use`);
    const sort = await nextSort(trx('modifier_groups').where({ location_id: locationId }).whereNull('retired_at'));
    await trx('modifier_groups').where({ id }).update({ retired_at: null, sort });
    await assertMenuOrderable(trx, locationId);
    return id;
  });

export const moveGroup = (deps: Deps, user: SessionUser, id: number, { direction }: MoveBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const group = await ownedRow(trx, 'modifier_groups', locationId, id, 'Group of extras');
    if (group.retired_at) throw conflict('Restore it before moving it');
    const siblings = await trx('modifier_groups').where({ location_id: locationId }).whereNull('retired_at').orderBy(['sort', 'id']).pluck('id');
    await moveRow(trx, 'modifier_groups', siblings, id, direction);
    return id;
  });

async function liveGroup(trx: Trx, locationId: number, groupId: number) {
  const group = await ownedRow(trx, 'modifier_groups', locationId, groupId, 'Group of extras');
  if (group.retired_at) throw conflict(`The group ${group.name} is retired`);
}

const modifierRow = (b: ModifierBody) => ({ group_id: b.groupId, name: b.name, price_cents: b.priceCents, ingredients: JSON.stringify(b.ingredients) });

export const createModifier = (deps: Deps, user: SessionUser, body: ModifierBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    await liveGroup(trx, locationId, body.groupId);
    const sort = await nextSort(trx('modifiers').where({ group_id: body.groupId }));
    const [{ id }] = await trx('modifiers')
      .insert({ ...modifierRow(body), location_id: locationId, sort })
      .returning('id');
    return id;
  });

export const updateModifier = (deps: Deps, user: SessionUser, id: number, body: ModifierBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const modifier = await ownedRow(trx, 'modifiers', locationId, id, 'Extra');
    await liveGroup(trx, locationId, body.groupId);
    const sort = body.groupId === modifier.group_id ? modifier.sort : await nextSort(trx('modifiers').where({ group_id: body.groupId }));
    await trx('modifiers')
      .where({ id })
      .update({ ...modifierRow(body), sort });
    await assertMenuOrderable(trx, locationId);
    return id;
  });

export const retireModifier = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId, at }) => {
    const modifier = await ownedRow(trx, 'modifiers', locationId, id, 'Extra');
    if (modifier.retired_at) throw conflict(`${modifier.name} is already retired`);
    await trx('modifiers').where({ id }).update({ retired_at: at });
    await assertMenuOrderable(trx, locationId);
    return id;
  });

export const restoreModifier = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const modifier = await ownedRow(trx, 'modifiers', locationId, id, 'Extra');
    if (!modifier.retired_at) throw conflict(`${modifier.name} is in use`);
    await liveGroup(trx, locationId, modifier.group_id);
    const sort = await nextSort(trx('modifiers').where({ group_id: modifier.group_id }).whereNull('retired_at'));
    await trx('modifiers').where({ id }).update({ retired_at: null, sort });
    return id;
  });

export const moveModifier = (deps: Deps, user: SessionUser, id: number, { direction }: MoveBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const modifier = await ownedRow(trx, 'modifiers', locationId, id, 'Extra');
    if (modifier.retired_at) throw conflict('Restore it before moving it');
    const siblings = await trx('modifiers').where({ group_id: modifier.group_id }).whereNull('retired_at').orderBy(['sort', 'id']).pluck('id');
    await moveRow(trx, 'modifiers', siblings, id, direction);
    return id;
  });
