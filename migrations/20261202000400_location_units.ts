import type { Knex } from 'knex';

// The units a café reads cup sizes and temperatures in. Display only: sizes, milk and pitchers
// stay in millilitres, so changing the unit never rewrites a recipe or a past order.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('locations', (t) => {
    t.string('volume_unit', 8).notNullable().defaultTo('ml').checkIn(['ml', 'us_floz']);
    t.string('temperature_unit', 1).notNullable().defaultTo('C').checkIn(['C', 'F']);
  });
}

// SQLite's own DROP COLUMN: Knex would rebuild the table, which users, pitchers and orders
// reference, and the rebuild fails with foreign keys on.
export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE locations DROP COLUMN temperature_unit');
  await knex.raw('ALTER TABLE locations DROP COLUMN volume_unit');
}
