import type { Knex } from 'knex';

// Tips. Per café: off by default; on, the Counter offers up to three suggested percentages
// (stored as a JSON array of whole percents) and, if allowed, an amount the customer names. Per
// order: the tip in cents, outside the order's total (never taxed, never discounted); what the
// customer paid is total_cents + tip_cents, and refunded_cents counts everything given back.
export async function up(knex: Knex): Promise<void> {
  // SQLite's own ADD COLUMN (Knex would rebuild locations, which other tables reference)
  await knex.raw('ALTER TABLE locations ADD COLUMN tips_on boolean NOT NULL DEFAULT FALSE');
  await knex.raw(`ALTER TABLE locations ADD COLUMN tip_percents varchar(40) NOT NULL DEFAULT '[10,15,20]'`);
  await knex.raw('ALTER TABLE locations ADD COLUMN tip_custom boolean NOT NULL DEFAULT TRUE');
  await knex.raw('ALTER TABLE orders ADD COLUMN tip_cents integer NOT NULL DEFAULT 0');
}

export async function down(knex: Knex): Promise<void> {
  // SQLite's own DROP COLUMN: Knex would rebuild the tables, which fails while other tables reference them
  await knex.raw('ALTER TABLE orders DROP COLUMN tip_cents');
  for (const column of ['tip_custom', 'tip_percents', 'tips_on']) await knex.raw(`ALTER TABLE locations DROP COLUMN ${column}`);
}
