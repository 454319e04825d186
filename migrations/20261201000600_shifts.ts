import type { Knex } from 'knex';

// A shift: opened by the lead with a cash float, the baristas on bar and the wait target; closed
// with a cash count. Orders belong to the shift they were taken in.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('shifts', (t) => {
    t.increments('id');
    t.integer('location_id').notNullable().references('locations.id');
    t.string('opened_at').notNullable();
    t.integer('opened_by').notNullable().references('users.id');
    t.integer('opening_float_cents').notNullable();
    t.integer('baristas_on_bar').notNullable();
    t.integer('wait_target_seconds').notNullable();
    t.string('closed_at');
    t.integer('closed_by').references('users.id');
    t.integer('expected_cash_cents');
    t.integer('counted_cash_cents');
    t.string('close_note', 200);
    t.index(['location_id', 'opened_at']);
  });
  // one open shift per café at a time
  await knex.raw('CREATE UNIQUE INDEX shifts_one_open_per_location ON shifts (location_id) WHERE closed_at IS NULL');

  await knex.schema.alterTable('orders', (t) => {
    t.integer('shift_id').references('shifts.id');
    t.index(['shift_id']);
    t.index(['location_id', 'created_at']);
    t.index(['location_id', 'ready_at']);
  });
  await knex.schema.alterTable('order_items', (t) => {
    t.index(['done_at']);
  });
  await knex.schema.alterTable('refunds', (t) => {
    t.index(['order_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('refunds', (t) => t.dropIndex(['order_id']));
  await knex.schema.alterTable('order_items', (t) => t.dropIndex(['done_at']));
  await knex.schema.alterTable('orders', (t) => {
    t.dropIndex(['location_id', 'ready_at']);
    t.dropIndex(['location_id', 'created_at']);
    t.dropIndex(['shift_id']);
    t.dropForeign(['shift_id']);
    t.dropColumn('shift_id');
  });
  await knex.schema.dropTable('shifts');
}
