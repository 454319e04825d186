import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('menu_categories', (t) => {
    t.increments('id');
    t.integer('location_id').notNullable().references('locations.id');
    t.string('name', 60).notNullable();
    t.integer('sort').notNullable().defaultTo(0);
    t.string('retired_at');
  });

  await knex.schema.createTable('milk_options', (t) => {
    t.increments('id');
    t.integer('location_id').notNullable().references('locations.id');
    t.string('name', 40).notNullable();
    t.string('code', 2).notNullable(); // lane badge, e.g. OA
    t.integer('upcharge_cents').notNullable().defaultTo(0);
    t.json('allergens').notNullable().defaultTo('[]');
    t.integer('sort').notNullable().defaultTo(0);
    t.string('retired_at');
    t.unique(['location_id', 'code']);
  });

  await knex.schema.createTable('menu_items', (t) => {
    t.increments('id');
    t.integer('category_id').notNullable().references('menu_categories.id');
    t.string('name', 60).notNullable();
    t.string('station', 8).notNullable().checkIn(['bar', 'counter']);
    t.integer('price_cents'); // when the item has no sizes
    t.integer('shots').notNullable().defaultTo(0);
    t.boolean('takes_milk').notNullable().defaultTo(false);
    t.integer('default_milk_id').references('milk_options.id');
    t.string('texture', 8).checkIn(['flat', 'silky', 'foamy', 'cold']);
    t.json('allergens').notNullable().defaultTo('[]');
    t.boolean('available').notNullable().defaultTo(true); // false while 86'd
    t.integer('sort').notNullable().defaultTo(0);
    t.string('retired_at');
  });

  await knex.schema.createTable('item_sizes', (t) => {
    t.increments('id');
    t.integer('item_id').notNullable().references('menu_items.id').onDelete('CASCADE');
    t.string('name', 20).notNullable();
    t.integer('volume_ml').notNullable();
    t.integer('price_cents').notNullable();
    t.integer('shots').notNullable().defaultTo(0);
    t.integer('milk_ml').notNullable().defaultTo(0); // cold milk the recipe takes
    t.integer('dose_dg').notNullable().defaultTo(0); // ground coffee for the recipe's shots, in 0.1 g
    t.integer('yield_dg').notNullable().defaultTo(0); // espresso out, in 0.1 g
    t.boolean('is_default').notNullable().defaultTo(false);
    t.integer('sort').notNullable().defaultTo(0);
  });

  // A group of extras: single choice (one syrup) or several (decaf + extra hot), optional or
  // required, offered only on the items it is linked to.
  await knex.schema.createTable('modifier_groups', (t) => {
    t.increments('id');
    t.integer('location_id').notNullable().references('locations.id');
    t.string('name', 40).notNullable();
    t.string('selection', 6).notNullable().defaultTo('multi').checkIn(['single', 'multi']);
    t.boolean('required').notNullable().defaultTo(false);
    t.integer('sort').notNullable().defaultTo(0);
  });

  await knex.schema.createTable('item_modifier_groups', (t) => {
    t.integer('item_id').notNullable().references('menu_items.id').onDelete('CASCADE');
    t.integer('group_id').notNullable().references('modifier_groups.id').onDelete('CASCADE');
    t.primary(['item_id', 'group_id']);
  });

  await knex.schema.createTable('modifiers', (t) => {
    t.increments('id');
    t.integer('location_id').notNullable().references('locations.id');
    t.integer('group_id').notNullable().references('modifier_groups.id');
    t.string('name', 40).notNullable();
    t.integer('price_cents').notNullable().defaultTo(0);
    t.json('allergens').notNullable().defaultTo('[]');
    t.integer('sort').notNullable().defaultTo(0);
    t.string('retired_at');
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['modifiers', 'item_modifier_groups', 'modifier_groups', 'item_sizes', 'menu_items', 'milk_options', 'menu_categories']) {
    await knex.schema.dropTable(table);
  }
}
