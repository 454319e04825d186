import type { Knex } from 'knex';

// The owner's Team screen: invitation and reset links, quick-switch PINs.
//
// - users.awaiting_password: an invited person who has not yet set a password (their
//   password_hash is a hash of random bytes nobody knows, so they can't sign in until then).
// - users.pin_*: a 4–6 digit PIN for switching person on a shared terminal, bcrypt-hashed, with
//   the count of wrong tries since the last good one and, after too many, a lock until a time.
// - invitations: one row per link mailed. Only the SHA-256 of the link's token is stored, so the
//   table can't be used to sign anyone in; a link is good once, until it expires, and only while
//   it is the person's newest (a new link voids the older ones).
// Who bumped a drink is already order_items.done_by (set by every bump, cleared by a recall).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.boolean('awaiting_password').notNullable().defaultTo(false);
    t.string('pin_hash');
    t.integer('pin_failures').notNullable().defaultTo(0);
    t.string('pin_failed_at');
    t.string('pin_locked_until');
  });

  await knex.schema.createTable('invitations', (t) => {
    t.increments('id');
    t.integer('location_id').notNullable().references('locations.id');
    t.integer('user_id').notNullable().references('users.id');
    // invite: a new person's first password; reset: a new password for someone who has one
    t.string('purpose', 8).notNullable().checkIn(['invite', 'reset']);
    t.string('token_hash', 64).notNullable().unique(); // hex SHA-256 of the token in the link
    t.integer('created_by').references('users.id');
    t.string('created_at').notNullable();
    t.string('expires_at').notNullable();
    t.string('sent_at'); // the mail server accepted the mail
    t.string('used_at');
    t.string('voided_at'); // a newer link, or the person was deactivated
    t.index(['user_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  // SQLite's own DROP COLUMN: Knex would rebuild the table, which fails while other tables reference it
  await knex.schema.dropTable('invitations');
  await knex.raw('ALTER TABLE users DROP COLUMN pin_locked_until');
  await knex.raw('ALTER TABLE users DROP COLUMN pin_failed_at');
  await knex.raw('ALTER TABLE users DROP COLUMN pin_failures');
  await knex.raw('ALTER TABLE users DROP COLUMN pin_hash');
  await knex.raw('ALTER TABLE users DROP COLUMN awaiting_password');
}
