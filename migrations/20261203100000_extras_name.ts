import type { Knex } from 'knex';

// One word for what a drink can add (a syrup, decaf, a dry foam): the screens always said
// extras, the tables and the order lines' column said modifiers. Renamed here, on both databases.
// The live events already stored are replayed to a screen that resumes after the upgrade, so their
// JSON says extras too (the keys only; names and prices inside are left as they are).
const TABLES = [
  ['modifier_groups', 'extra_groups'],
  ['item_modifier_groups', 'item_extra_groups'],
  ['modifiers', 'extras'],
] as const;
const KEYS = [
  ['"modifierGroupIds":', '"extraGroupIds":'],
  ['"modifierGroups":', '"extraGroups":'],
  ['"modifierIds":', '"extraIds":'],
  ['"modifiers":', '"extras":'],
] as const;

/** Rewrites keys in every stored event's payload (json on PostgreSQL, text on SQLite). */
async function renameKeys(knex: Knex, keys: readonly (readonly [string, string])[]) {
  const pg = knex.client.config.client === 'pg';
  for (const [from, to] of keys) {
    const text = pg ? 'payload::text' : 'payload';
    const replaced = `replace(${text}, ?, ?)`;
    await knex.raw(`UPDATE events SET payload = ${pg ? `${replaced}::json` : replaced} WHERE ${text} LIKE ?`, [from, to, `%${from}%`]);
  }
}

export async function up(knex: Knex): Promise<void> {
  for (const [from, to] of TABLES) await knex.raw(`ALTER TABLE ${from} RENAME TO ${to}`);
  await knex.raw('ALTER TABLE order_items RENAME COLUMN modifiers TO extras');
  await renameKeys(knex, KEYS);
}

export async function down(knex: Knex): Promise<void> {
  await renameKeys(
    knex,
    KEYS.map(([from, to]) => [to, from] as const),
  );
  await knex.raw('ALTER TABLE order_items RENAME COLUMN extras TO modifiers');
  for (const [from, to] of [...TABLES].reverse()) await knex.raw(`ALTER TABLE ${to} RENAME TO ${from}`);
}
