import type { Knex } from 'knex';
import { dialectOf } from '@server/db/dialect';

// Reports over a long range. Two things the report and the ticket history kept recomputing:
//
// - orders.wait_seconds: a ticket's fired → ready wait, to the millisecond, as the reports work it
//   out (server/reports/sql.ts, WAIT_OF_ORDER): set when the ticket becomes ready, cleared
//   by a recall, null without bar drinks. The ticket history sorts on it instead of working the wait
//   out for every order. (No index on it: the sort needs the date filter's index, and an index led by
//   location_id drew the shift report's queries away from orders.shift_id.)
// - report_days: one past café day's report partial per row (server/reports/days.ts),
//   filled lazily by the range report. A row must never outlive a change to its day's orders, so
//   triggers delete it whenever an order or an order line of that day is inserted, changed or
//   deleted (refunds, late bumps and payments, the history generator, anything else), inside the
//   same transaction as the change.
const WAIT_OF_ORDER = `CASE WHEN o.fired_at IS NOT NULL AND o.ready_at IS NOT NULL
  AND EXISTS (SELECT 1 FROM order_items b WHERE b.order_id = o.id AND b.station = 'bar')
  THEN ROUND((julianday(o.ready_at) - julianday(o.fired_at)) * 86400, 3) END`;

const forget = (row: 'NEW' | 'OLD') => `DELETE FROM report_days WHERE location_id = ${row}.location_id AND business_date = ${row}.business_date;`;
const forgetLine = (row: 'NEW' | 'OLD') =>
  `DELETE FROM report_days WHERE (location_id, business_date) IN (SELECT location_id, business_date FROM orders WHERE id = ${row}.order_id);`;

const TRIGGERS: [string, string][] = [
  ['report_days_order_insert', `AFTER INSERT ON orders BEGIN ${forget('NEW')} END`],
  ['report_days_order_update', `AFTER UPDATE ON orders BEGIN ${forget('OLD')} ${forget('NEW')} END`],
  ['report_days_order_delete', `AFTER DELETE ON orders BEGIN ${forget('OLD')} END`],
  ['report_days_line_insert', `AFTER INSERT ON order_items BEGIN ${forgetLine('NEW')} END`],
  ['report_days_line_update', `AFTER UPDATE ON order_items BEGIN ${forgetLine('OLD')} ${forgetLine('NEW')} END`],
  ['report_days_line_delete', `AFTER DELETE ON order_items BEGIN ${forgetLine('OLD')} END`],
];

// PostgreSQL (added with DATABASE_URL; SQLite sees exactly the SQL above): the same wait from the
// ISO-8601 text columns, and the same forgetting done by one trigger function per table.
const PG_WAIT_OF_ORDER = `CASE WHEN o.fired_at IS NOT NULL AND o.ready_at IS NOT NULL
  AND EXISTS (SELECT 1 FROM order_items b WHERE b.order_id = o.id AND b.station = 'bar')
  THEN ROUND(EXTRACT(EPOCH FROM (o.ready_at::timestamptz - o.fired_at::timestamptz))::numeric, 3) END`;

const PG_FORGET = (row: 'NEW' | 'OLD', table: 'orders' | 'order_items') => (table === 'orders' ? forget(row) : forgetLine(row));
const pgTriggerFunction = (table: 'orders' | 'order_items') => `CREATE FUNCTION report_days_forget_${table}() RETURNS trigger AS $$
BEGIN
  IF TG_OP IN ('UPDATE', 'DELETE') THEN ${PG_FORGET('OLD', table)} END IF;
  IF TG_OP IN ('INSERT', 'UPDATE') THEN ${PG_FORGET('NEW', table)} END IF;
  RETURN NULL;
END $$ LANGUAGE plpgsql`;
const PG_TABLES = ['orders', 'order_items'] as const;

export async function up(knex: Knex): Promise<void> {
  const pg = dialectOf(knex) === 'postgres';
  await knex.schema.alterTable('orders', (t) => {
    t.float('wait_seconds');
  });
  await knex.raw(`UPDATE orders AS o SET wait_seconds = ${pg ? PG_WAIT_OF_ORDER : WAIT_OF_ORDER} WHERE o.ready_at IS NOT NULL`);

  await knex.schema.createTable('report_days', (t) => {
    t.integer('location_id').notNullable().references('locations.id');
    t.string('business_date', 10).notNullable();
    t.string('computed_at').notNullable();
    t.json('payload').notNullable();
    t.primary(['location_id', 'business_date']);
  });
  if (pg) {
    for (const table of PG_TABLES) {
      await knex.raw(pgTriggerFunction(table));
      await knex.raw(
        `CREATE TRIGGER report_days_forget AFTER INSERT OR UPDATE OR DELETE ON ${table} FOR EACH ROW EXECUTE FUNCTION report_days_forget_${table}()`,
      );
    }
  } else for (const [name, body] of TRIGGERS) await knex.raw(`CREATE TRIGGER ${name} ${body}`);
}

export async function down(knex: Knex): Promise<void> {
  if (dialectOf(knex) === 'postgres') {
    for (const table of PG_TABLES) {
      await knex.raw(`DROP TRIGGER IF EXISTS report_days_forget ON ${table}`);
      await knex.raw(`DROP FUNCTION IF EXISTS report_days_forget_${table}()`);
    }
  } else for (const [name] of [...TRIGGERS].reverse()) await knex.raw(`DROP TRIGGER IF EXISTS ${name}`);
  await knex.schema.dropTable('report_days');
  await knex.schema.alterTable('orders', (t) => {
    t.dropColumn('wait_seconds');
  });
}
