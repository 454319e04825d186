// The back-office menu editor: categories, items, sizes and recipes, milks, groups of extras.
// Every command answers { id, menu } with the whole editable menu as it now is. Each kind has the
// same four commands (src/commands.ts): create, update (the whole row), retired { retired } and
// move { direction }; these are their handlers.
import type { CommandName, Commands } from '@/commands';
import type { RetiredBody } from '@/domain/menu-admin-schemas';
import type { MenuAdminResult } from '@/domain/menu-admin-view';
import type { SessionUser } from '@/domain/types';
import type { CommandHandlers } from '@server/commands';
import type { Deps } from '@server/deps';
import { createCategory, moveCategory, restoreCategory, retireCategory, updateCategory } from './admin-categories';
import { createItem, moveItem, restoreItem, retireItem, retireSize, restoreSize, updateItem } from './admin-items';
import { createMilk, moveMilk, restoreMilk, retireMilk, updateMilk } from './admin-milks';
import { createGroup, createExtra, moveGroup, moveExtra, restoreGroup, restoreExtra, retireGroup, retireExtra, updateGroup, updateExtra } from './admin-extras';

type Who = { deps: Deps; user: SessionUser };
type ById = Who & { params: { id: number } };

const create =
  <B>(run: (deps: Deps, user: SessionUser, body: B) => Promise<MenuAdminResult>) =>
  ({ deps, user }: Who, body: B) =>
    run(deps, user, body);
const byId =
  <B>(run: (deps: Deps, user: SessionUser, id: number, body: B) => Promise<MenuAdminResult>) =>
  ({ deps, user, params }: ById, body: B) =>
    run(deps, user, params.id, body);
/** Retire or restore: never a delete, since past orders point at menu rows. */
const retired = (retire: (deps: Deps, user: SessionUser, id: number) => Promise<MenuAdminResult>, restore: typeof retire) =>
  byId((deps, user, id, body: RetiredBody) => (body.retired ? retire : restore)(deps, user, id));

type MenuAdminCommand = { [N in CommandName]: Commands[N] extends { path: `/menu-admin/${string}` } ? N : never }[CommandName];

export const menuAdminCommands: CommandHandlers<MenuAdminCommand> = {
  createCategory: create(createCategory),
  updateCategory: byId(updateCategory),
  setCategoryRetired: retired(retireCategory, restoreCategory),
  moveCategory: byId(moveCategory),
  createItem: create(createItem),
  updateItem: byId(updateItem),
  setItemRetired: retired(retireItem, restoreItem),
  moveItem: byId(moveItem),
  createMilk: create(createMilk),
  updateMilk: byId(updateMilk),
  setMilkRetired: retired(retireMilk, restoreMilk),
  moveMilk: byId(moveMilk),
  createExtraGroup: create(createGroup),
  updateExtraGroup: byId(updateGroup),
  setExtraGroupRetired: retired(retireGroup, restoreGroup),
  moveExtraGroup: byId(moveGroup),
  createExtra: create(createExtra),
  updateExtra: byId(updateExtra),
  setExtraRetired: retired(retireExtra, restoreExtra),
  moveExtra: byId(moveExtra),
  setSizeRetired: retired(retireSize, restoreSize),
};
