import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('orders', (t) => {
    t.increments('id');
    t.integer('location_id').notNullable().references('locations.id');
    t.string('client_order_id', 36).notNullable().unique(); // replaying it returns the same order
    t.string('business_date', 10).notNullable(); // the café's local date; numbers restart daily
    t.integer('number').notNullable();
    t.string('customer_name', 40).notNullable();
    t.string('status', 10).notNullable().checkIn(['open', 'ready', 'collected']);
    t.integer('subtotal_cents').notNullable();
    t.integer('discount_cents').notNullable().defaultTo(0);
    t.integer('tax_cents').notNullable();
    t.integer('total_cents').notNullable();
    t.string('payment_method', 10).notNullable().checkIn(['cash']);
    t.integer('tendered_cents');
    t.integer('change_cents');
    t.integer('taken_by').references('users.id');
    t.string('fired_at').notNullable();
    t.string('ready_at');
    t.string('collected_at');
    t.unique(['location_id', 'business_date', 'number']);
    t.index(['location_id', 'status']);
  });

  await knex.schema.createTable('order_items', (t) => {
    t.increments('id');
    t.integer('order_id').notNullable().references('orders.id');
    t.integer('menu_item_id').notNullable().references('menu_items.id');
    t.integer('line_no').notNullable();
    // what was sold, copied so later menu edits don't rewrite history
    t.string('item_name', 60).notNullable();
    t.string('station', 8).notNullable().checkIn(['bar', 'counter']);
    t.integer('size_id').references('item_sizes.id');
    t.string('size_name', 20);
    t.integer('volume_ml');
    t.integer('milk_id').references('milk_options.id');
    t.string('milk_name', 40);
    t.string('milk_code', 2);
    t.integer('shots').notNullable().defaultTo(0);
    t.integer('milk_ml').notNullable().defaultTo(0);
    t.string('texture', 8);
    t.json('modifiers').notNullable().defaultTo('[]');
    t.string('note', 140);
    t.integer('price_cents').notNullable();
    t.string('status', 8).notNullable().checkIn(['queued', 'making', 'done']);
    t.string('started_at');
    t.string('done_at');
    t.integer('done_by').references('users.id');
    // Bumps are numbered in order; drinks bumped by one command share the number, so a recall
    // undoes exactly the last command even when two land in the same millisecond.
    t.integer('bump_seq');
    t.index(['order_id']);
  });

  // The realtime log. Its id is the sequence number a screen resumes from.
  await knex.schema.createTable('events', (t) => {
    t.increments('id');
    t.integer('location_id').notNullable().references('locations.id');
    t.string('type', 32).notNullable();
    t.json('payload').notNullable();
    t.integer('actor_id').references('users.id');
    t.string('created_at').notNullable();
    t.index(['location_id', 'id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('events');
  await knex.schema.dropTable('order_items');
  await knex.schema.dropTable('orders');
}
