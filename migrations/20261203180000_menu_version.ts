import type { Knex } from 'knex';

// event_seqs.menu_version: counts the café's commands that changed what its menu reads (the menu,
// the café's settings, the baristas on bar), as their menu.* or shift.changed event is written
// (server/events.ts, in the same upsert as the event's number: no lock more). A process keeps the
// menu it read with this number and reads it again only when the number moved (menu-cache.ts).
export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE event_seqs ADD COLUMN menu_version integer NOT NULL DEFAULT 0');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE event_seqs DROP COLUMN menu_version');
}
