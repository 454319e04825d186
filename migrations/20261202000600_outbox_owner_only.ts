import type { Knex } from 'knex';

// Mail that carries a sign-in link (invitations, password resets) is listed in the Outbox to the
// owner only: a lead reading the demo Outbox must not be able to open someone else's account.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('outbox', (t) => {
    t.boolean('owner_only').notNullable().defaultTo(false);
  });
}

export async function down(knex: Knex): Promise<void> {
  // SQLite's own DROP COLUMN: Knex would rebuild the table, which fails while other tables reference it
  await knex.raw('ALTER TABLE outbox DROP COLUMN owner_only');
}
