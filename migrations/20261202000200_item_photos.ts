import type { Knex } from 'knex';

// One photo per menu item: the file name of its WebP under the media folder (MEDIA_DIR/menu/),
// a random name made at upload, never a name the owner's computer chose. Null: no photo.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('menu_items', (t) => {
    t.string('photo', 64);
  });
}

export async function down(knex: Knex): Promise<void> {
  // SQLite's own DROP COLUMN: Knex would rebuild the table, which fails while other tables reference it
  await knex.raw('ALTER TABLE menu_items DROP COLUMN photo');
}
