import type { Knex } from 'knex';
import { dialectOf } from '@server/db/dialect';

// Cafés belong to a group: the owner of several cafés sees them together and moves between them.
// Every café already in the database goes into one group, named after the first café: their
// usernames are already unique across them, so they can share one sign-in list.
// SQLite can't add a NOT NULL column with a foreign key in place, so `locations` is rebuilt there
// (the documented twelve-step way: foreign keys off, copy, drop, rename, check), outside a
// migration transaction because PRAGMA foreign_keys can't change inside one.
export const config = { transaction: false };

const GROUP_COLUMN = ', `group_id` integer not null references `cafe_groups`(`id`)';

async function createGroups(trx: Knex.Transaction) {
  await trx.schema.createTable('cafe_groups', (t) => {
    t.increments('id');
    t.string('name', 80).notNullable();
    t.string('created_at').notNullable();
  });
  const first = await trx('locations').orderBy('id').first('name', 'created_at');
  if (!first) return null;
  const [{ id }] = await trx('cafe_groups').insert({ name: first.name, created_at: first.created_at }).returning('id');
  return id as number;
}

/** The `locations` table's own CREATE statement on SQLite, as the earlier migrations left it. */
async function locationsSql(trx: Knex.Transaction): Promise<string> {
  const [row] = (await trx.raw("SELECT sql FROM sqlite_master WHERE type = 'table' AND name = 'locations'")) as { sql: string }[];
  return row.sql;
}

async function rebuildLocations(trx: Knex.Transaction, createSql: string, columns: string) {
  await trx.raw(createSql.replace(/^CREATE TABLE [`"]locations[`"]/, 'CREATE TABLE `locations_next`'));
  await trx.raw(`INSERT INTO locations_next SELECT ${columns} FROM locations`);
  await trx.raw('DROP TABLE locations');
  await trx.raw('ALTER TABLE locations_next RENAME TO locations');
}

async function sqliteRebuild(knex: Knex, change: (trx: Knex.Transaction) => Promise<void>) {
  await knex.raw('PRAGMA foreign_keys = OFF');
  try {
    await knex.transaction(async (trx) => {
      await change(trx);
      const broken = await trx.raw('PRAGMA foreign_key_check');
      if (broken.length > 0) throw new Error(`Foreign keys broken by the rebuild: ${JSON.stringify(broken)}`);
    });
  } finally {
    await knex.raw('PRAGMA foreign_keys = ON');
  }
}

async function columnsOf(trx: Knex.Transaction): Promise<string[]> {
  return Object.keys(await trx('locations').columnInfo());
}

export async function up(knex: Knex): Promise<void> {
  if (dialectOf(knex) === 'postgres') {
    await knex.transaction(async (trx) => {
      const group = await createGroups(trx);
      await trx.schema.alterTable('locations', (t) => t.integer('group_id').references('cafe_groups.id'));
      if (group !== null) await trx('locations').update({ group_id: group });
      await trx.raw('ALTER TABLE locations ALTER COLUMN group_id SET NOT NULL');
      await trx.schema.alterTable('locations', (t) => t.index('group_id'));
    });
    return;
  }
  await sqliteRebuild(knex, async (trx) => {
    const group = await createGroups(trx);
    const sql = await locationsSql(trx);
    const columns = (await columnsOf(trx)).map((c) => `\`${c}\``).join(', ');
    await rebuildLocations(trx, `${sql.slice(0, -1)}${GROUP_COLUMN})`, `${columns}, ${group ?? 'NULL'}`);
    await trx.schema.alterTable('locations', (t) => t.index('group_id'));
  });
}

export async function down(knex: Knex): Promise<void> {
  if (dialectOf(knex) === 'postgres') {
    await knex.transaction(async (trx) => {
      await trx.schema.alterTable('locations', (t) => t.dropColumn('group_id'));
      await trx.schema.dropTable('cafe_groups');
    });
    return;
  }
  await sqliteRebuild(knex, async (trx) => {
    await trx.raw('DROP INDEX IF EXISTS locations_group_id_index');
    const sql = await locationsSql(trx);
    if (!sql.endsWith(`${GROUP_COLUMN})`)) throw new Error('locations has changed since the groups were added; no way back from here');
    const columns = (await columnsOf(trx))
      .filter((c) => c !== 'group_id')
      .map((c) => `\`${c}\``)
      .join(', ');
    await rebuildLocations(trx, `${sql.slice(0, -GROUP_COLUMN.length - 1)})`, columns);
    await trx.schema.dropTable('cafe_groups');
  });
}
