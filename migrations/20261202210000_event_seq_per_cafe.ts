import type { Knex } from 'knex';

// The live sequence number becomes per café and commit-ordered. It was the global events.id, which
// PostgreSQL hands out at insert, not at commit: a screen could resume past an event whose
// transaction committed later, and never be sent it. Now each command takes its numbers from its
// café's counter row as the last step of its transaction (server/events.ts), which holds
// that row until commit: numbers are gap-free and committed in order. Same SQL on both databases.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('event_seqs', (t) => {
    t.integer('location_id').primary().references('locations.id');
    t.integer('last_seq').notNullable();
  });
  await knex.schema.alterTable('events', (t) => {
    t.integer('seq');
  });
  // the events so far, numbered per café in their old order
  await knex.raw('UPDATE events SET seq = (SELECT count(*) FROM events e WHERE e.location_id = events.location_id AND e.id <= events.id)');
  await knex.raw('INSERT INTO event_seqs (location_id, last_seq) SELECT location_id, max(seq) FROM events GROUP BY location_id');
  await knex.schema.alterTable('events', (t) => {
    t.unique(['location_id', 'seq']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('events', (t) => {
    t.dropUnique(['location_id', 'seq']);
  });
  await knex.raw('ALTER TABLE events DROP COLUMN seq');
  await knex.schema.dropTable('event_seqs');
}
