// What every menu command shares: one transaction with its menu.changed event, rows looked up
// only inside the signed-in café (another café's id is simply not found), moving a row among its
// siblings, and the menu-wide rules a change must leave standing.
import type { Knex } from 'knex';
import type { MenuAdminResult } from '@/domain/menu-admin-view';
import { moveAmong, type Direction } from '@/domain/menu-order';
import type { SessionUser } from '@/domain/types';
import { conflict, notFound } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { appendMenuChangedEvent, runCommand } from '@server/events';
import { loadAdminMenu } from './admin';

export type Trx = Knex.Transaction;

export interface MenuCommandContext {
  trx: Trx;
  locationId: number;
  at: string;
}

/** Run one menu command: its changes and a menu.changed event in one transaction. */
export function menuCommand(deps: Deps, user: SessionUser, work: (c: MenuCommandContext) => Promise<number>): Promise<MenuAdminResult> {
  return runCommand(deps, async (trx) => {
    const at = deps.clock().toISOString();
    const id = await work({ trx, locationId: user.locationId, at });
    const event = await appendMenuChangedEvent(trx, user.locationId, at, user.id);
    return { result: { id, menu: await loadAdminMenu(trx, user.locationId) }, events: [event] };
  });
}

export async function ownedCategory(trx: Trx, locationId: number, id: number) {
  const row = await trx('menu_categories').where({ id, location_id: locationId }).first();
  if (!row) throw notFound('Category');
  return row;
}

export async function ownedItem(trx: Trx, locationId: number, id: number) {
  const row = await trx('menu_items')
    .join('menu_categories', 'menu_categories.id', 'menu_items.category_id')
    .where({ 'menu_items.id': id, 'menu_categories.location_id': locationId })
    .first('menu_items.*');
  if (!row) throw notFound('Menu item');
  return row;
}

export async function ownedSize(trx: Trx, locationId: number, id: number) {
  const row = await trx('item_sizes')
    .join('menu_items', 'menu_items.id', 'item_sizes.item_id')
    .join('menu_categories', 'menu_categories.id', 'menu_items.category_id')
    .where({ 'item_sizes.id': id, 'menu_categories.location_id': locationId })
    .first('item_sizes.*');
  if (!row) throw notFound('Size');
  return row;
}

export async function ownedRow(trx: Trx, table: 'milk_options' | 'extra_groups' | 'extras', locationId: number, id: number, what: string) {
  const row = await trx(table).where({ id, location_id: locationId }).first();
  if (!row) throw notFound(what);
  return row;
}

/**
 * Move a row one place among its siblings still in use (retired rows keep their place and come
 * back at the end). `siblings` lists the ids in their current order.
 */
export async function moveRow(trx: Trx, table: string, siblings: number[], id: number, direction: Direction) {
  const order = moveAmong(siblings, id, direction);
  if (!order) throw conflict(direction === 'up' ? 'It is already first' : 'It is already last');
  for (const [sort, rowId] of order.entries()) await trx(table).where({ id: rowId }).update({ sort });
}

/** The next sort value after every row of `query` (a restored or new row goes last). */
export async function nextSort(query: Knex.QueryBuilder): Promise<number> {
  const row = await query.max({ m: 'sort' }).first();
  return Number(row?.m ?? -1) + 1;
}

/** Items on sale (not retired, in a category in use) at the café. */
export const liveItems = (trx: Trx, locationId: number) =>
  trx('menu_items')
    .join('menu_categories', 'menu_categories.id', 'menu_items.category_id')
    .where({ 'menu_categories.location_id': locationId })
    .whereNull('menu_items.retired_at')
    .whereNull('menu_categories.retired_at');

/**
 * Rules a command must leave standing, or the Counter could no longer take an order:
 * every item on sale that takes milk has a milk in use as its default, and every required group
 * of extras on an item on sale has a choice in use.
 */
export async function assertMenuOrderable(trx: Trx, locationId: number) {
  const orphan = await liveItems(trx, locationId)
    .join('milk_options', 'milk_options.id', 'menu_items.default_milk_id')
    .whereNotNull('milk_options.retired_at')
    .first('menu_items.name as item', 'milk_options.name as milk');
  if (orphan) throw conflict(`${orphan.milk} is the milk ${orphan.item} comes with: choose another milk for it first`);

  const groups = await liveItems(trx, locationId)
    .join('item_extra_groups', 'item_extra_groups.item_id', 'menu_items.id')
    .join('extra_groups', 'extra_groups.id', 'item_extra_groups.group_id')
    .whereNull('extra_groups.retired_at')
    .where('extra_groups.required', true)
    .distinct('extra_groups.id', 'extra_groups.name');
  for (const g of groups) {
    const choice = await trx('extras').where({ group_id: g.id }).whereNull('retired_at').first('id');
    if (!choice) throw conflict(`${g.name} is required on items for sale, so it needs at least one choice in use`);
  }
}
