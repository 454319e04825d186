import type { Knex } from 'knex';

// The receipt mail that goes with an order carrying the customer's e-mail: claimed once
// ('sending', by a conditional update, so a replayed or raced order never mails twice), then
// 'sent' or 'failed' with the mail server's reason. Null: no receipt is due (yet).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('orders', (t) => {
    t.string('receipt_mail_state', 10).nullable().checkIn(['sending', 'sent', 'failed']);
    t.string('receipt_mail_at', 30).nullable();
    t.string('receipt_mail_error', 200).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  // SQLite's own DROP COLUMN: Knex would rebuild the table, which fails while other tables reference it
  for (const column of ['receipt_mail_error', 'receipt_mail_at', 'receipt_mail_state']) await knex.raw(`ALTER TABLE orders DROP COLUMN ${column}`);
}
