import type { Knex } from 'knex';
import { dialectOf } from '@server/db/dialect';

// Started jugs, and the café's rules for planning jugs.
//
// A jug a barista starts is stored with its pour (pitcher, cold milk, waste, texture) and its
// drinks, so a later order, a rush or a settings change can't re-plan it under the barista's
// hands. A drink is in at most one jug, for good: jug_drinks is keyed by the drink, so two screens
// starting overlapping jugs can't both write it.
//
// Rules per café: the most drinks in one jug, and how much cold milk grows when steamed per
// texture (percent); per pitcher: the least cold milk that covers the steam tip. Defaults are
// common practice, from memory (no published source): two to four cups a jug; growth about
// 10–20 % flat, 20–30 % silky, 50–100 % foamy (we take 15, 25, 75); a minimum of about a third of
// the pitcher (existing pitchers get a third of their capacity rounded up to 10 ml, at most their
// fill line).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('jugs', (t) => {
    t.increments('id');
    t.integer('location_id').notNullable().references('locations.id');
    t.integer('milk_id').references('milk_options.id');
    // the pitcher as it was when the jug was started (pitchers can be edited or removed later)
    t.integer('capacity_ml').notNullable();
    t.integer('fill_line_ml').notNullable();
    t.integer('min_fill_ml').notNullable();
    t.integer('cold_ml').notNullable();
    t.integer('waste_ml').notNullable();
    t.string('steam_for', 8).notNullable().checkIn(['flat', 'silky', 'foamy']);
    t.boolean('fits').notNullable().defaultTo(true);
    t.string('started_at').notNullable();
    t.integer('started_by').references('users.id');
  });
  await knex.schema.createTable('jug_drinks', (t) => {
    t.integer('order_item_id').primary().references('order_items.id');
    t.integer('jug_id').notNullable().references('jugs.id').index();
  });
  // SQLite's own ADD COLUMN (Knex would rebuild these tables, which others reference).
  await knex.raw('ALTER TABLE locations ADD COLUMN jug_max_drinks integer NOT NULL DEFAULT 4 CHECK (jug_max_drinks BETWEEN 1 AND 12)');
  await knex.raw('ALTER TABLE locations ADD COLUMN expansion_flat_pct integer NOT NULL DEFAULT 15 CHECK (expansion_flat_pct BETWEEN 0 AND 200)');
  await knex.raw('ALTER TABLE locations ADD COLUMN expansion_silky_pct integer NOT NULL DEFAULT 25 CHECK (expansion_silky_pct BETWEEN 0 AND 200)');
  await knex.raw('ALTER TABLE locations ADD COLUMN expansion_foamy_pct integer NOT NULL DEFAULT 75 CHECK (expansion_foamy_pct BETWEEN 0 AND 200)');
  await knex.raw('ALTER TABLE pitchers ADD COLUMN min_fill_ml integer NOT NULL DEFAULT 0 CHECK (min_fill_ml >= 0 AND min_fill_ml <= fill_line_ml)');
  // two-argument MIN is SQLite's; PostgreSQL (DATABASE_URL) spells it LEAST
  const least = dialectOf(knex) === 'postgres' ? 'LEAST' : 'MIN';
  await knex('pitchers').update({ min_fill_ml: knex.raw(`${least}(fill_line_ml, ((capacity_ml + 29) / 30) * 10)`) });
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE pitchers DROP COLUMN min_fill_ml');
  for (const column of ['expansion_foamy_pct', 'expansion_silky_pct', 'expansion_flat_pct', 'jug_max_drinks']) {
    await knex.raw(`ALTER TABLE locations DROP COLUMN ${column}`);
  }
  await knex.schema.dropTable('jug_drinks');
  await knex.schema.dropTable('jugs');
}
