import type { Knex } from 'knex';

// What the bar still had open when the shift closed, kept for the shift report and its CSV: the
// count of tickets at the bar and how long the oldest had waited since it was fired.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('shifts', (t) => {
    t.integer('open_tickets_at_close').nullable();
    t.integer('oldest_open_wait_seconds_at_close').nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  // SQLite's own DROP COLUMN: Knex would rebuild the table, which orders reference
  await knex.raw('ALTER TABLE shifts DROP COLUMN oldest_open_wait_seconds_at_close');
  await knex.raw('ALTER TABLE shifts DROP COLUMN open_tickets_at_close');
}
