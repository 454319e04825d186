import type { Knex } from 'knex';

// Drink options (src/domain/drink-options.ts): an extra may say what it does at the bar (wet, more
// foam, dry, kids' temperature), and a drink sold with kids' temperature remembers it, so the jug
// plan keeps it out of jugs steamed as usual. Existing extras do nothing at the bar (null), and
// every drink already sold was steamed as usual.
const EFFECTS = "('wet', 'more_foam', 'dry', 'kids_temp')";

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`ALTER TABLE extras ADD COLUMN bar_effect varchar(16) CHECK (bar_effect IN ${EFFECTS})`);
  await knex.schema.alterTable('order_items', (t) => t.boolean('kids_temp').notNullable().defaultTo(false));
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('order_items', (t) => t.dropColumn('kids_temp'));
  await knex.schema.alterTable('extras', (t) => t.dropColumn('bar_effect'));
}
