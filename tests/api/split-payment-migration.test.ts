// The migration that lets an order be paid in parts, on a real SQLite file (the PostgreSQL leg
// migrates its template database with it in every server-pg run): every order, payment and link is
// kept through the orders table's rebuild, its indexes and triggers are back, a part is paid once,
// one card runs at a time per order, and down gives back the tables as they were.
import type { Knex } from 'knex';
import { describe, expect, it } from 'vitest';
import { migrationConfig } from '@server/db/knex';
import { migrationDatabases } from '../support/migration-db';

const MIGRATION = '20261203160000_split_payment.ts';
const databaseBefore = migrationDatabases();
const AT = '2026-03-02T14:00:00.000Z';

const schemaOf = async (db: Knex) =>
  (await db.raw("SELECT type, name, tbl_name FROM sqlite_master WHERE name NOT LIKE 'sqlite_%' ORDER BY type, name")) as unknown[];

/** A database just before this migration with a café, a person, a paid cash order with a drink, and a refund. */
async function beforeSplit() {
  const db = await databaseBefore(MIGRATION);
  const [{ id: group }] = await db('cafe_groups').insert({ name: 'Tideline Espresso', created_at: AT }).returning('id');
  const [{ id: cafe }] = await db('locations').insert({ name: 'Tideline Espresso', created_at: AT, group_id: group }).returning('id');
  const [{ id: person }] = await db('users')
    .insert({ location_id: cafe, group_id: group, username: 'sam', name: 'Sam', role: 'cashier', password_hash: 'x', created_at: AT })
    .returning('id');
  const [{ id: orderId }] = await db('orders')
    .insert({
      location_id: cafe,
      client_order_id: '00000000-0000-4000-8000-000000000001',
      business_date: '2026-03-02',
      number: 1,
      customer_name: 'Ada',
      status: 'collected',
      payment_status: 'paid',
      subtotal_cents: 450,
      tax_cents: 0,
      total_cents: 450,
      payment_method: 'cash',
      tendered_cents: 500,
      change_cents: 50,
      taken_by: person,
      created_at: AT,
    })
    .returning('id');
  const [{ id: paymentId }] = await db('payments')
    .insert({
      order_id: orderId,
      method: 'cash',
      status: 'succeeded',
      amount_cents: 450,
      tendered_cents: 500,
      change_cents: 50,
      created_at: AT,
      updated_at: AT,
    })
    .returning('id');
  await db('refunds').insert({ order_id: orderId, payment_id: paymentId, amount_cents: 100, reason: 'Cold', created_by: person, created_at: AT });
  return { db, orderId, paymentId, orders: await db('orders').select('*'), payments: await db('payments').select('*'), schema: await schemaOf(db) };
}

describe(`migration ${MIGRATION}`, () => {
  it('keeps every order, payment and link; the indexes and triggers are back; old payments are part 1', async () => {
    const { db, orders, payments, schema } = await beforeSplit();
    await db.migrate.up(migrationConfig);
    expect(await db('orders').select('*')).toEqual(orders.map((o) => ({ ...o, split_cash_cents: null })));
    expect(await db('payments').select('*')).toEqual(payments.map((p) => ({ ...p, part: 1 })));
    const names = (await schemaOf(db)) as { name: string }[];
    // everything there was, less the one index this migration replaces, plus its two
    const expected = (schema as { name: string }[]).map((s) => s.name).filter((n) => n !== 'payments_one_live_per_order');
    expect(names.map((s) => s.name)).toEqual(expect.arrayContaining([...expected, 'payments_one_running_per_order', 'payments_one_paid_per_part']));
    expect(await db.raw('PRAGMA foreign_key_check')).toEqual([]);
  });

  it('takes an order paid in parts, a part once, and one running card per order', async () => {
    const { db, orderId } = await beforeSplit();
    await db.migrate.up(migrationConfig);
    await db('orders').where({ id: orderId }).update({ payment_method: 'split', split_cash_cents: 200 });
    const payment = (part: number, status: string) => ({ order_id: orderId, part, method: 'card', status, amount_cents: 100, created_at: AT, updated_at: AT });
    await db('payments').insert(payment(2, 'succeeded'));
    await expect(db('payments').insert(payment(2, 'succeeded'))).rejects.toThrow(/UNIQUE/);
    await db('payments').insert(payment(3, 'processing'));
    await expect(db('payments').insert(payment(4, 'processing'))).rejects.toThrow(/UNIQUE/);
    await expect(db('orders').where({ id: orderId }).update({ payment_method: 'voucher' })).rejects.toThrow(/CHECK/);
    // a trigger that came back with the table: a change to an order clears its stored report day
    await db('report_days').insert({
      location_id: (await db('orders').where({ id: orderId }).first('location_id')).location_id,
      business_date: '2026-03-02',
      payload: '{}',
      computed_at: AT,
    });
    await db('orders').where({ id: orderId }).update({ customer_name: 'Ada L' });
    expect(await db('report_days').count({ n: '*' }).first()).toEqual({ n: 0 });
  });

  it('down gives back the tables as they were; it refuses while an order is split', async () => {
    const { db, orderId, orders, payments, schema } = await beforeSplit();
    await db.migrate.up(migrationConfig);
    await db('orders').where({ id: orderId }).update({ payment_method: 'split' });
    await expect(db.migrate.down(migrationConfig)).rejects.toThrow(/paid in parts/);
    await db('orders').where({ id: orderId }).update({ payment_method: 'cash' });
    await db.migrate.down(migrationConfig);
    expect(await db('orders').select('*')).toEqual(orders);
    expect(await db('payments').select('*')).toEqual(payments);
    expect(await schemaOf(db)).toEqual(schema);
    await expect(db('orders').where({ id: orderId }).update({ payment_method: 'split' })).rejects.toThrow(/CHECK/);
  });
});
