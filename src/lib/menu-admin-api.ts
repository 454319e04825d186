// The back-office menu editor's commands: categories, items, sizes and recipes, milks, modifiers.
// Commands run only in the browser, so they are plain HTTP calls; what the editor reads
// (`api.menuAdmin()`) is in src/reads.ts.
import type { CategoryBody, ItemBody, MilkBody, ModifierBody, ModifierGroupBody } from '@/domain/menu-admin-schemas';
import type { MenuAdminResult } from '@/domain/menu-admin-view';
import type { Direction } from '@/domain/menu-order';
import { http } from './http';

export interface MenuAdminBodies {
  categories: CategoryBody;
  items: ItemBody;
  milks: MilkBody;
  'modifier-groups': ModifierGroupBody;
  modifiers: ModifierBody;
}
export type MenuKind = keyof MenuAdminBodies;

export const menuAdminCommands = {
  create: <K extends MenuKind>(kind: K, body: MenuAdminBodies[K]) => http<MenuAdminResult>('POST', `/menu-admin/${kind}`, body),
  update: <K extends MenuKind>(kind: K, id: number, body: MenuAdminBodies[K]) => http<MenuAdminResult>('PUT', `/menu-admin/${kind}/${id}`, body),
  /** Retire (true) or restore (false); nothing on the menu is ever deleted. */
  setRetired: (kind: MenuKind | 'sizes', id: number, retired: boolean) => http<MenuAdminResult>('POST', `/menu-admin/${kind}/${id}/retired`, { retired }),
  move: (kind: MenuKind, id: number, direction: Direction) => http<MenuAdminResult>('POST', `/menu-admin/${kind}/${id}/move`, { direction }),
  /** 86 and back on: the Counter's own route, open to leads too. */
  setAvailable: (itemId: number, available: boolean) => http('POST', `/menu/items/${itemId}/availability`, { available }),
};
