// The menu as the Counter and the pricing read it, kept per café in this process: an order used to
// read the menu's eight tables again (the bench's closed loop, BENCHMARKS.md). What is kept is
// checked against the café's menu version (one small read) and read again only when a command moved
// it (server/events.ts: every command that changes the menu, the settings or the baristas on bar
// writes its menu.* or shift.changed event, and the version moves with it). So another process of
// the group, or a menu changed a moment ago, is seen by the next order.
import type { MenuView } from '@/domain/types';
import type { Db } from '@server/db/knex';
import { loadMenu } from './menu';

interface Kept {
  version: number;
  menu: MenuView;
}
/** per database (tests run several servers in one process), per café */
const kept = new WeakMap<Db, Map<number, Kept>>();

async function menuVersion(db: Db, locationId: number): Promise<number> {
  const row = await db('event_seqs').where({ location_id: locationId }).first('menu_version');
  return Number(row?.menu_version ?? 0);
}

/**
 * The café's menu; shared between callers, so never changed by one. Inside a transaction it is read
 * afresh and not kept: that transaction may have changed the menu and not yet committed.
 */
export async function currentMenu(db: Db, locationId: number): Promise<MenuView> {
  if (db.isTransaction) return loadMenu(db, locationId);
  // the version is read before the menu: a change committed in between makes the kept menu newer
  // than its version says, and the next read (seeing the version moved) reads it again
  const version = await menuVersion(db, locationId);
  let cafes = kept.get(db);
  if (!cafes) kept.set(db, (cafes = new Map()));
  const hit = cafes.get(locationId);
  if (hit?.version === version) return hit.menu;
  const menu = await loadMenu(db, locationId);
  cafes.set(locationId, { version, menu });
  return menu;
}
