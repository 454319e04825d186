import type { Knex } from 'knex';

// Mail caught by the local SMTP fake (server/fakes/smtp-fake.ts), shown on the Outbox screen.
// received_at is an ISO-8601 UTC string like every other timestamp, so text order is time order.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('outbox', (t) => {
    t.increments('id');
    t.string('message_id', 255).notNullable();
    t.string('from_address', 320).notNullable();
    t.json('to_addresses').notNullable().defaultTo('[]'); // JSON text: ["a@example.com", …]
    t.string('subject', 998).notNullable(); // RFC 5322 line limit
    t.text('text_body').notNullable();
    t.text('html_body');
    // the café it was sent for; null when the sender did not say (then no screen lists it)
    t.integer('location_id'); // no foreign key: the fake stores whatever a sender claims, as a mail server would
    t.string('received_at').notNullable();
    t.index(['location_id', 'received_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('outbox');
}
