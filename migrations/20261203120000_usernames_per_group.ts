import type { Knex } from 'knex';
import { dialectOf } from '@server/db/dialect';

// Sign-in names are unique within a group of cafés, not across the whole database: two groups on
// one installation may each have a "sam", and adding a person never tells an owner which names
// another group uses. The unique index needs the group on the row itself, so `users.group_id`
// copies the group of the person's café (a café never changes group). SQLite can't add a NOT NULL
// column with a foreign key in place, so `users` is rebuilt there, as cafe_groups did with
// `locations`, outside a migration transaction because PRAGMA foreign_keys can't change inside one.
export const config = { transaction: false };

const GROUP_COLUMN = ', `group_id` integer not null references `cafe_groups`(`id`)';
/** The table's constraints follow its columns; the new column goes last among the columns. */
const FIRST_CONSTRAINT = ', foreign key(';
const OLD_UNIQUE = 'users_username_unique';
const GROUP_OF_CAFE = '(SELECT group_id FROM locations WHERE locations.id = users.location_id)';

async function usersSql(trx: Knex.Transaction): Promise<string> {
  const [row] = (await trx.raw("SELECT sql FROM sqlite_master WHERE type = 'table' AND name = 'users'")) as { sql: string }[];
  return row.sql;
}

/** The other indexes of `users` (dropped with the table in a rebuild), to create again after it. */
async function otherIndexes(trx: Knex.Transaction, except: string[]): Promise<string[]> {
  const rows = (await trx.raw("SELECT name, sql FROM sqlite_master WHERE type = 'index' AND tbl_name = 'users' AND sql IS NOT NULL")) as {
    name: string;
    sql: string;
  }[];
  return rows.filter((r) => !except.includes(r.name)).map((r) => r.sql);
}

/** SQLite's documented way to change a table: a new one, the rows copied, the old dropped, renamed. */
async function rebuildUsers(knex: Knex, createSql: string, selectList: string, keep: string[]) {
  await knex.raw('PRAGMA foreign_keys = OFF');
  try {
    await knex.transaction(async (trx) => {
      const indexes = await otherIndexes(trx, keep);
      await trx.raw(createSql.replace(/^CREATE TABLE [`"]users[`"]/, 'CREATE TABLE `users_next`'));
      await trx.raw(`INSERT INTO users_next SELECT ${selectList} FROM users`);
      await trx.raw('DROP TABLE users');
      await trx.raw('ALTER TABLE users_next RENAME TO users');
      for (const sql of indexes) await trx.raw(sql);
      const broken = await trx.raw('PRAGMA foreign_key_check');
      if (broken.length > 0) throw new Error(`Foreign keys broken by the rebuild: ${JSON.stringify(broken)}`);
    });
  } finally {
    await knex.raw('PRAGMA foreign_keys = ON');
  }
}

const columnList = async (knex: Knex) => Object.keys(await knex('users').columnInfo()).map((c) => `\`${c}\``);

export async function up(knex: Knex): Promise<void> {
  if (dialectOf(knex) === 'postgres') {
    await knex.transaction(async (trx) => {
      await trx.schema.alterTable('users', (t) => t.integer('group_id').references('cafe_groups.id'));
      await trx.raw(`UPDATE users SET group_id = ${GROUP_OF_CAFE}`);
      await trx.raw('ALTER TABLE users ALTER COLUMN group_id SET NOT NULL');
      await trx.schema.alterTable('users', (t) => {
        t.dropUnique(['username']);
        t.unique(['group_id', 'username']);
      });
    });
    return;
  }
  const sql = await knex.transaction(usersSql);
  const columns = (await columnList(knex)).join(', ');
  if (!sql.includes(FIRST_CONSTRAINT)) throw new Error('users is not as the earlier migrations left it');
  await rebuildUsers(knex, sql.replace(FIRST_CONSTRAINT, `${GROUP_COLUMN}${FIRST_CONSTRAINT}`), `${columns}, ${GROUP_OF_CAFE}`, [OLD_UNIQUE]);
  await knex.schema.alterTable('users', (t) => t.unique(['group_id', 'username']));
}

export async function down(knex: Knex): Promise<void> {
  // Going back needs names unique everywhere again; the unique index refuses if two groups share one.
  if (dialectOf(knex) === 'postgres') {
    await knex.transaction(async (trx) => {
      await trx.schema.alterTable('users', (t) => {
        t.dropUnique(['group_id', 'username']);
        t.unique(['username']);
      });
      await trx.schema.alterTable('users', (t) => t.dropColumn('group_id'));
    });
    return;
  }
  await knex.schema.alterTable('users', (t) => t.dropUnique(['group_id', 'username']));
  const sql = await knex.transaction(usersSql);
  if (!sql.includes(`${GROUP_COLUMN}${FIRST_CONSTRAINT}`)) throw new Error('users has changed since names became unique per group; no way back from here');
  const columns = (await columnList(knex)).filter((c) => c !== '`group_id`');
  await rebuildUsers(knex, sql.replace(GROUP_COLUMN, ''), columns.join(', '), []);
  await knex.schema.alterTable('users', (t) => t.unique(['username']));
}
