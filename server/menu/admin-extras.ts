// Groups of extras (single or multiple choice, required or not, on which items) and the extras
// in them. Orders copy an extra's name and price when taken, so edits never reach past orders.
import type { ExtraBody, ExtraGroupBody, MoveBody } from '@/domain/menu-admin-schemas';
import type { SessionUser } from '@/domain/types';
import { conflict } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { assertMenuOrderable, menuCommand, moveRow, nextSort, ownedItem, ownedRow, type Trx } from './admin-shared';

async function setItems(trx: Trx, locationId: number, groupId: number, itemIds: number[]) {
  for (const itemId of itemIds) await ownedItem(trx, locationId, itemId);
  await trx('item_extra_groups').where({ group_id: groupId }).delete();
  if (itemIds.length) await trx('item_extra_groups').insert(itemIds.map((item_id) => ({ item_id, group_id: groupId })));
}

const groupRow = (b: ExtraGroupBody) => ({ name: b.name, selection: b.selection, required: b.required });

export const createGroup = (deps: Deps, user: SessionUser, body: ExtraGroupBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const sort = await nextSort(trx('extra_groups').where({ location_id: locationId }));
    const [{ id }] = await trx('extra_groups')
      .insert({ ...groupRow(body), location_id: locationId, sort })
      .returning('id');
    await setItems(trx, locationId, id, body.itemIds);
    await assertMenuOrderable(trx, locationId);
    return id;
  });

export const updateGroup = (deps: Deps, user: SessionUser, id: number, body: ExtraGroupBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    await ownedRow(trx, 'extra_groups', locationId, id, 'Group of extras');
    await trx('extra_groups').where({ id }).update(groupRow(body));
    await setItems(trx, locationId, id, body.itemIds);
    await assertMenuOrderable(trx, locationId);
    return id;
  });

/** Retired, a group leaves every item's sheet; its links stay so a restore brings it back. */
export const retireGroup = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId, at }) => {
    const group = await ownedRow(trx, 'extra_groups', locationId, id, 'Group of extras');
    if (group.retired_at) throw conflict(`${group.name} is already retired`);
    await trx('extra_groups').where({ id }).update({ retired_at: at });
    return id;
  });

export const restoreGroup = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const group = await ownedRow(trx, 'extra_groups', locationId, id, 'Group of extras');
    if (!group.retired_at) throw conflict(`${group.name} is in use`);
    const sort = await nextSort(trx('extra_groups').where({ location_id: locationId }).whereNull('retired_at'));
    await trx('extra_groups').where({ id }).update({ retired_at: null, sort });
    await assertMenuOrderable(trx, locationId);
    return id;
  });

export const moveGroup = (deps: Deps, user: SessionUser, id: number, { direction }: MoveBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const group = await ownedRow(trx, 'extra_groups', locationId, id, 'Group of extras');
    if (group.retired_at) throw conflict('Restore it before moving it');
    const siblings = await trx('extra_groups').where({ location_id: locationId }).whereNull('retired_at').orderBy(['sort', 'id']).pluck('id');
    await moveRow(trx, 'extra_groups', siblings, id, direction);
    return id;
  });

async function liveGroup(trx: Trx, locationId: number, groupId: number) {
  const group = await ownedRow(trx, 'extra_groups', locationId, groupId, 'Group of extras');
  if (group.retired_at) throw conflict(`The group ${group.name} is retired`);
}

const extraRow = (b: ExtraBody) => ({
  group_id: b.groupId,
  name: b.name,
  price_cents: b.priceCents,
  ingredients: JSON.stringify(b.ingredients),
  bar_effect: b.barEffect,
});

export const createExtra = (deps: Deps, user: SessionUser, body: ExtraBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    await liveGroup(trx, locationId, body.groupId);
    const sort = await nextSort(trx('extras').where({ group_id: body.groupId }));
    const [{ id }] = await trx('extras')
      .insert({ ...extraRow(body), location_id: locationId, sort })
      .returning('id');
    return id;
  });

export const updateExtra = (deps: Deps, user: SessionUser, id: number, body: ExtraBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const extra = await ownedRow(trx, 'extras', locationId, id, 'Extra');
    await liveGroup(trx, locationId, body.groupId);
    const sort = body.groupId === extra.group_id ? extra.sort : await nextSort(trx('extras').where({ group_id: body.groupId }));
    await trx('extras')
      .where({ id })
      .update({ ...extraRow(body), sort });
    await assertMenuOrderable(trx, locationId);
    return id;
  });

export const retireExtra = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId, at }) => {
    const extra = await ownedRow(trx, 'extras', locationId, id, 'Extra');
    if (extra.retired_at) throw conflict(`${extra.name} is already retired`);
    await trx('extras').where({ id }).update({ retired_at: at });
    await assertMenuOrderable(trx, locationId);
    return id;
  });

export const restoreExtra = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const extra = await ownedRow(trx, 'extras', locationId, id, 'Extra');
    if (!extra.retired_at) throw conflict(`${extra.name} is in use`);
    await liveGroup(trx, locationId, extra.group_id);
    const sort = await nextSort(trx('extras').where({ group_id: extra.group_id }).whereNull('retired_at'));
    await trx('extras').where({ id }).update({ retired_at: null, sort });
    return id;
  });

export const moveExtra = (deps: Deps, user: SessionUser, id: number, { direction }: MoveBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const extra = await ownedRow(trx, 'extras', locationId, id, 'Extra');
    if (extra.retired_at) throw conflict('Restore it before moving it');
    const siblings = await trx('extras').where({ group_id: extra.group_id }).whereNull('retired_at').orderBy(['sort', 'id']).pluck('id');
    await moveRow(trx, 'extras', siblings, id, direction);
    return id;
  });
