import type { Knex } from 'knex';

// Bean lots with their stock, the dial-in log, and each location's dial-in window.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('bean_lots', (t) => {
    t.increments('id');
    t.integer('location_id').notNullable().references('locations.id');
    t.string('name', 60).notNullable();
    t.string('roaster', 60).notNullable();
    t.string('origin', 120);
    t.string('notes', 200);
    t.string('roast_date', 10).notNullable(); // the date on the bag, YYYY-MM-DD
    t.string('received_date', 10).notNullable();
    t.integer('received_g').notNullable();
    // which grinder it feeds; bumped drinks draw from the lot in the espresso (or decaf) grinder
    t.string('hopper', 8).notNullable().defaultTo('shelf').checkIn(['espresso', 'decaf', 'shelf']);
    // freshness window, per lot: coffees rest and fade at their own pace
    t.integer('rest_days').notNullable().defaultTo(5);
    t.integer('best_until_days').notNullable().defaultTo(30);
    t.string('created_at').notNullable();
    t.string('updated_at').notNullable();
    t.string('retired_at');
    t.index(['location_id']);
  });
  // one lot at a time in each grinder
  await knex.raw("CREATE UNIQUE INDEX bean_lots_one_per_grinder ON bean_lots (location_id, hopper) WHERE retired_at IS NULL AND hopper <> 'shelf'");

  await knex.schema.createTable('dial_in_shots', (t) => {
    t.increments('id');
    t.integer('location_id').notNullable().references('locations.id');
    t.integer('lot_id').notNullable().references('bean_lots.id');
    t.string('grind', 12).notNullable();
    t.integer('dose_dg').notNullable();
    t.integer('yield_dg').notNullable();
    t.integer('time_ds').notNullable(); // tenths of a second
    // the advice as given, against the window of the day (the window may change later)
    t.string('advice', 12).notNullable();
    t.boolean('good').notNullable();
    t.string('taste_note', 140);
    t.integer('pulled_by').notNullable().references('users.id');
    t.string('pulled_at').notNullable();
    t.index(['lot_id', 'pulled_at']);
  });

  // Every gram taken from a lot: one row per bumped drink (written in the bump's transaction, so a
  // recall deletes it) and one per dial-in shot.
  await knex.schema.createTable('bean_usage', (t) => {
    t.increments('id');
    t.integer('lot_id').notNullable().references('bean_lots.id');
    t.string('source', 8).notNullable().checkIn(['drink', 'dial_in']);
    t.integer('order_item_id').references('order_items.id');
    t.integer('shot_id').references('dial_in_shots.id');
    t.integer('dose_dg').notNullable();
    t.string('used_at').notNullable();
    t.index(['lot_id', 'used_at']);
    t.index(['order_item_id']);
  });

  await knex.schema.createTable('bean_settings', (t) => {
    t.integer('location_id').primary().references('locations.id');
    t.integer('time_min_s').notNullable();
    t.integer('time_max_s').notNullable();
    t.integer('ratio_min_x10').notNullable();
    t.integer('ratio_max_x10').notNullable();
    t.integer('low_stock_g').notNullable();
    t.string('updated_at').notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('bean_settings');
  await knex.schema.dropTable('bean_usage');
  await knex.schema.dropTable('dial_in_shots');
  await knex.schema.dropTable('bean_lots');
}
