import type { Knex } from 'knex';

// One drink of a paid order refunded or remade (src/domain/remakes.ts).
// - order_items.refunded_at: when the drink's own money was given back; a drink not yet made then
//   leaves the bar. refunds.order_item_id names that drink on its refund (on each part's refund
//   of a split order); the drink is marked once, conditionally, so it is refunded once however
//   many screens send it at once.
// - order_items.remake_of: a remake is a new drink on the same ticket, at no charge, pointing at
//   the drink it replaces; unique, so a drink is remade once (a remake that goes wrong again is
//   itself remade). remake_reason is one of REMAKE_REASONS, remake_note the staff's own words,
//   remade_by who asked for it and remade_at when (the remake reaches the bar then, not when the
//   order was fired: the bar's pace counts it from there).
const REASONS = "('made_wrong', 'spilled', 'not_right', 'other')";

export async function up(knex: Knex): Promise<void> {
  // plain ADD COLUMN on both databases (Knex would rebuild order_items on SQLite, which other tables reference)
  await knex.raw('ALTER TABLE order_items ADD COLUMN refunded_at varchar(30)');
  await knex.raw('ALTER TABLE order_items ADD COLUMN remake_of integer REFERENCES order_items (id)');
  await knex.raw(`ALTER TABLE order_items ADD COLUMN remake_reason varchar(16) CHECK (remake_reason IN ${REASONS})`);
  await knex.raw('ALTER TABLE order_items ADD COLUMN remake_note varchar(140)');
  await knex.raw('ALTER TABLE order_items ADD COLUMN remade_by integer REFERENCES users (id)');
  await knex.raw('ALTER TABLE order_items ADD COLUMN remade_at varchar(30)');
  await knex.raw('CREATE UNIQUE INDEX order_items_remake_of_unique ON order_items (remake_of)');
  await knex.raw('ALTER TABLE refunds ADD COLUMN order_item_id integer REFERENCES order_items (id)');
  await knex.raw('CREATE INDEX refunds_order_item_id_index ON refunds (order_item_id)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP INDEX refunds_order_item_id_index');
  await knex.raw('ALTER TABLE refunds DROP COLUMN order_item_id');
  await knex.raw('DROP INDEX order_items_remake_of_unique');
  for (const column of ['remade_at', 'remade_by', 'remake_note', 'remake_reason', 'remake_of', 'refunded_at']) {
    await knex.raw(`ALTER TABLE order_items DROP COLUMN ${column}`);
  }
}
