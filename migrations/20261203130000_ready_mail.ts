import type { Knex } from 'knex';

// The "ready" mail: a customer who left an address for the receipt is told when the order is
// ready. Per café it can be turned off (on by default, as the Counter tells the customer it is
// sent). Per order it is claimed once ('sending', by a conditional update, so a recall and
// re-bump, a raced bump or a second process never mails twice), then 'sent' or 'failed' with the
// mail server's reason. Null: no ready mail was sent (yet).
export async function up(knex: Knex): Promise<void> {
  // SQLite's own ADD COLUMN (Knex would rebuild locations, which other tables reference)
  await knex.raw('ALTER TABLE locations ADD COLUMN ready_mail boolean NOT NULL DEFAULT TRUE');
  await knex.schema.alterTable('orders', (t) => {
    t.string('ready_mail_state', 10).nullable().checkIn(['sending', 'sent', 'failed']);
    t.string('ready_mail_at', 30).nullable();
    t.string('ready_mail_error', 200).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  // SQLite's own DROP COLUMN: Knex would rebuild the tables, which fails while other tables reference them
  for (const column of ['ready_mail_error', 'ready_mail_at', 'ready_mail_state']) await knex.raw(`ALTER TABLE orders DROP COLUMN ${column}`);
  await knex.raw('ALTER TABLE locations DROP COLUMN ready_mail');
}
