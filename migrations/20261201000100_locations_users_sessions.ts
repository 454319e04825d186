import type { Knex } from 'knex';

// Every timestamp column holds an ISO-8601 UTC string (…Z), so text order is time order.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('locations', (t) => {
    t.increments('id');
    t.string('name', 80).notNullable();
    t.string('time_zone', 64).notNullable().defaultTo('UTC');
    t.string('currency', 3).notNullable().defaultTo('USD');
    t.string('locale', 20).notNullable().defaultTo('en-US');
    t.string('tax_mode', 10).notNullable().defaultTo('exclusive').checkIn(['exclusive', 'inclusive']);
    // thousandths of a percent: 8.25 % is 8250, 8.875 % is 8875
    t.integer('tax_rate_milli_pct').notNullable().defaultTo(0).checkBetween([0, 100_000]);
    t.integer('extra_shot_cents').notNullable().defaultTo(0);
    t.integer('wait_target_seconds').notNullable().defaultTo(240);
    t.integer('pickup_timeout_seconds').notNullable().defaultTo(600);
    t.string('allergen_list', 2).notNullable().defaultTo('US').checkIn(['US', 'EU']);
    t.integer('baristas_on_bar').notNullable().defaultTo(1); // the shift lead changes it during service
    t.string('receipt_footer', 200);
    // milk lost per jug (left in the pitcher, purged): added to every batch the jug plan pours
    t.integer('jug_waste_ml').notNullable().defaultTo(15);
    t.string('created_at').notNullable();
  });

  await knex.schema.createTable('users', (t) => {
    t.increments('id');
    t.integer('location_id').notNullable().references('locations.id');
    t.string('username', 64).notNullable().unique();
    t.string('name', 80).notNullable();
    t.string('email', 254); // where the owner gets shift reports
    t.string('role', 10).notNullable().checkIn(['cashier', 'barista', 'lead', 'owner']);
    t.string('password_hash').notNullable();
    t.boolean('active').notNullable().defaultTo(true);
    t.string('created_at').notNullable();
  });

  // Milk pitchers on the bar. The fill line is how much cold milk leaves room to stretch:
  // by common practice just below the base of the spout, a little over half the capacity.
  await knex.schema.createTable('pitchers', (t) => {
    t.increments('id');
    t.integer('location_id').notNullable().references('locations.id');
    t.integer('capacity_ml').notNullable();
    t.integer('fill_line_ml').notNullable();
    t.check('?? > 0 AND ?? <= ??', ['fill_line_ml', 'fill_line_ml', 'capacity_ml']);
  });

  // express-session rows, read and written by connect-session-knex
  await knex.schema.createTable('sessions', (t) => {
    t.string('sid').primary();
    t.json('sess').notNullable();
    t.timestamp('expired').notNullable().index();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sessions');
  await knex.schema.dropTable('pitchers');
  await knex.schema.dropTable('users');
  await knex.schema.dropTable('locations');
}
