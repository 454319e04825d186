import type { Knex } from 'knex';

// The back-office menu editor: a cup per size (what the cashier grabs), and retiring sizes and
// extra groups instead of deleting them, since past orders point at their sizes.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('item_sizes', (t) => {
    t.string('cup', 40);
    t.string('retired_at');
  });
  await knex.schema.alterTable('modifier_groups', (t) => {
    t.string('retired_at');
  });
}

export async function down(knex: Knex): Promise<void> {
  // SQLite's own DROP COLUMN: Knex would rebuild the table, which fails while other tables reference it
  await knex.raw('ALTER TABLE modifier_groups DROP COLUMN retired_at');
  await knex.raw('ALTER TABLE item_sizes DROP COLUMN retired_at');
  await knex.raw('ALTER TABLE item_sizes DROP COLUMN cup');
}
