import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('orders', (t) => {
    t.increments('id');
    t.integer('location_id').notNullable().references('locations.id');
    t.string('client_order_id', 36).notNullable().unique(); // replaying it returns the same order
    t.string('business_date', 10).notNullable(); // the café's local date; numbers restart daily
    t.integer('number').notNullable();
    t.string('customer_name', 40).notNullable();
    // pending: taken, waiting for its payment; open: fired to the bar; void: never made
    t.string('status', 10).notNullable().checkIn(['pending', 'open', 'ready', 'collected', 'void']);
    t.string('payment_status', 10).notNullable().defaultTo('unpaid').checkIn(['unpaid', 'paid', 'refunded']);
    t.string('service', 8).notNullable().defaultTo('takeaway').checkIn(['takeaway', 'dine_in']);
    t.json('allergens').notNullable().defaultTo('[]');
    t.string('allergy_note', 200);
    t.string('customer_email', 254);
    t.integer('subtotal_cents').notNullable();
    t.integer('discount_cents').notNullable().defaultTo(0);
    t.string('discount_reason', 120);
    t.integer('tax_cents').notNullable();
    t.integer('total_cents').notNullable();
    t.integer('refunded_cents').notNullable().defaultTo(0);
    t.string('payment_method', 10).notNullable().checkIn(['cash', 'card']);
    t.integer('tendered_cents');
    t.integer('change_cents');
    t.integer('quoted_wait_seconds');
    t.integer('taken_by').references('users.id');
    t.string('created_at').notNullable();
    t.string('fired_at'); // when it reached the bar: once paid
    t.string('void_reason', 200);
    t.string('rushed_at'); // a lead moved it to the front of the bar
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
    t.json('contains').notNullable().defaultTo('[]'); // allergens of the item, its milk and extras
    t.string('note', 140);
    t.integer('price_cents').notNullable();
    t.integer('dose_dg').notNullable().defaultTo(0); // coffee this drink's shots take, in 0.1 g
    t.string('status', 8).notNullable().checkIn(['queued', 'making', 'done']);
    // an allergy drink can't be bumped until a barista has read the allergy
    t.string('allergy_ack_at');
    t.integer('allergy_ack_by').references('users.id');
    t.string('started_at');
    t.integer('started_by').references('users.id');
    t.string('done_at');
    t.integer('done_by').references('users.id');
    // Bumps are numbered in order; drinks bumped by one command share the number, so a recall
    // undoes exactly the last command even when two land in the same millisecond.
    t.integer('bump_seq');
    t.index(['order_id']);
  });

  // Every payment attempt. At most one is in progress or succeeded per order, so an order can
  // never be charged twice, whatever the client retries.
  await knex.schema.createTable('payments', (t) => {
    t.increments('id');
    t.integer('order_id').notNullable().references('orders.id');
    t.string('method', 10).notNullable().checkIn(['cash', 'card']);
    t.string('status', 12).notNullable().checkIn(['processing', 'succeeded', 'declined', 'failed', 'canceled']);
    t.integer('amount_cents').notNullable();
    t.integer('tendered_cents');
    t.integer('change_cents');
    t.string('provider_id', 64);
    t.string('decline_code', 40);
    t.string('message', 200);
    t.string('created_at').notNullable();
    t.string('updated_at').notNullable();
    t.index(['order_id']);
  });
  await knex.raw("CREATE UNIQUE INDEX payments_one_live_per_order ON payments (order_id) WHERE status IN ('processing', 'succeeded')");

  await knex.schema.createTable('refunds', (t) => {
    t.increments('id');
    t.integer('order_id').notNullable().references('orders.id');
    t.integer('payment_id').notNullable().references('payments.id');
    t.integer('amount_cents').notNullable();
    t.string('reason', 200).notNullable();
    t.string('provider_id', 64);
    t.integer('created_by').notNullable().references('users.id');
    t.string('created_at').notNullable();
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
  await knex.schema.dropTable('refunds');
  await knex.schema.dropTable('payments');
  await knex.schema.dropTable('order_items');
  await knex.schema.dropTable('orders');
}
