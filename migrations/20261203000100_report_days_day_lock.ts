import type { Knex } from 'knex';
import { dialectOf } from '@server/db/dialect';

// A stored report day (report_days) must never be older than its orders. On SQLite the one
// connection runs transactions one after another, so the triggers of …0700 that forget a day when
// its orders change are enough, and SQLite sees nothing new here. On PostgreSQL, under read
// committed, a range report could work a day out, a refund of that day then change an order and
// forget the day (nothing stored yet), and the report store its now stale day after it. So the
// forgetting takes a shared advisory lock on the café's day, held until commit, and the report
// takes the same lock exclusively before working out the days it stores (lockReportDays in
// server/db/dialect.ts): each waits for the other's commit, and whichever is second sees the first.
// the café's day as two integers: its id and the date as a number (20260302)
const dayKey = (o: string) => `${o}.location_id, replace(${o}.business_date, '-', '')::integer`;

const forget = (row: 'NEW' | 'OLD') =>
  `PERFORM pg_advisory_xact_lock_shared(${dayKey(row)});
    DELETE FROM report_days WHERE location_id = ${row}.location_id AND business_date = ${row}.business_date;`;
const forgetLine = (row: 'NEW' | 'OLD') =>
  `PERFORM pg_advisory_xact_lock_shared(${dayKey('o')}) FROM orders o WHERE o.id = ${row}.order_id;
    DELETE FROM report_days WHERE (location_id, business_date) IN (SELECT location_id, business_date FROM orders WHERE id = ${row}.order_id);`;

// the bodies as …0700 made them, for down()
const oldForget = (row: 'NEW' | 'OLD') => `DELETE FROM report_days WHERE location_id = ${row}.location_id AND business_date = ${row}.business_date;`;
const oldForgetLine = (row: 'NEW' | 'OLD') =>
  `DELETE FROM report_days WHERE (location_id, business_date) IN (SELECT location_id, business_date FROM orders WHERE id = ${row}.order_id);`;

const triggerFunction = (
  table: 'orders' | 'order_items',
  body: (row: 'NEW' | 'OLD') => string,
) => `CREATE OR REPLACE FUNCTION report_days_forget_${table}() RETURNS trigger AS $$
BEGIN
  IF TG_OP IN ('UPDATE', 'DELETE') THEN ${body('OLD')} END IF;
  IF TG_OP IN ('INSERT', 'UPDATE') THEN ${body('NEW')} END IF;
  RETURN NULL;
END $$ LANGUAGE plpgsql`;

export async function up(knex: Knex): Promise<void> {
  if (dialectOf(knex) !== 'postgres') return;
  await knex.raw(triggerFunction('orders', forget));
  await knex.raw(triggerFunction('order_items', forgetLine));
}

export async function down(knex: Knex): Promise<void> {
  if (dialectOf(knex) !== 'postgres') return;
  await knex.raw(triggerFunction('orders', oldForget));
  await knex.raw(triggerFunction('order_items', oldForgetLine));
}
