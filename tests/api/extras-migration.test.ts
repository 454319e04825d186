// The migration that names extras one way everywhere (tables, the order lines' column, the keys of
// stored live events), on a real SQLite file: rows and links survive, a stored event a resuming
// screen replays says extras, and down gives back the old names and keys.
import { describe, expect, it } from 'vitest';
import { migrationConfig } from '@server/db/knex';
import { migrationDatabases } from '../support/migration-db';
import { jsonOf } from '../support/rows';

const MIGRATION = '20261203100000_extras_name.ts';
const databaseBefore = migrationDatabases();

/** A database migrated up to, not including, the rename; with a café, an extra on an item and a stored event. */
async function beforeRename() {
  const db = await databaseBefore(MIGRATION);
  const [{ id: location }] = await db('locations').insert({ name: 'Test café', created_at: new Date().toISOString() }).returning('id');
  const [{ id: category }] = await db('menu_categories').insert({ location_id: location, name: 'Coffee' }).returning('id');
  const [{ id: item }] = await db('menu_items').insert({ category_id: category, name: 'Latte', station: 'bar', price_cents: 450 }).returning('id');
  const [{ id: group }] = await db('modifier_groups').insert({ location_id: location, name: 'Syrup' }).returning('id');
  const [{ id: extra }] = await db('modifiers').insert({ location_id: location, group_id: group, name: 'Vanilla syrup', price_cents: 60 }).returning('id');
  await db('item_modifier_groups').insert({ item_id: item, group_id: group });
  // a drink on a ticket as the Bar's live event carried it, and a line as the Counter sent it
  const payload = { ticket: { id: 1, drinks: [{ name: 'Latte', modifiers: ['Vanilla syrup'] }] }, line: { menuItemId: item, modifierIds: [extra] } };
  await db('events').insert({ location_id: location, type: 'order.fired', payload: JSON.stringify(payload), created_at: new Date().toISOString(), seq: 1 });
  return { db, location, item, group, extra };
}

describe(`migration ${MIGRATION}`, () => {
  it('renames the tables and the column, keeps every row and link, and rewrites the stored events’ keys', async () => {
    const { db, item, group, extra } = await beforeRename();
    await db.migrate.up(migrationConfig);
    expect(await db('extra_groups').where({ id: group }).first('name')).toEqual({ name: 'Syrup' });
    expect(await db('extras').where({ id: extra }).first('name', 'price_cents', 'group_id')).toEqual({
      name: 'Vanilla syrup',
      price_cents: 60,
      group_id: group,
    });
    expect(await db('item_extra_groups').select('item_id', 'group_id')).toEqual([{ item_id: item, group_id: group }]);
    expect(Object.keys(await db('order_items').columnInfo())).toContain('extras');
    expect(Object.keys(await db('order_items').columnInfo())).not.toContain('modifiers');
    for (const old of ['modifier_groups', 'modifiers', 'item_modifier_groups']) expect(await db.schema.hasTable(old)).toBe(false);
    const [{ payload }] = await db('events').select('payload');
    expect(jsonOf(payload)).toEqual({
      ticket: { id: 1, drinks: [{ name: 'Latte', extras: ['Vanilla syrup'] }] },
      line: { menuItemId: item, extraIds: [extra] },
    });
  });

  it('down gives back the old names and keys', async () => {
    const { db, group, extra } = await beforeRename();
    const before = (await db('events').first('payload')).payload;
    await db.migrate.up(migrationConfig);
    await db.migrate.down(migrationConfig);
    expect(await db('modifiers').where({ id: extra }).first('group_id')).toEqual({ group_id: group });
    expect(await db.schema.hasTable('extras')).toBe(false);
    expect(Object.keys(await db('order_items').columnInfo())).toContain('modifiers');
    expect(jsonOf((await db('events').first('payload')).payload)).toEqual(jsonOf(before));
  });
});
