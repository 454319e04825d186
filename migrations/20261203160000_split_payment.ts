import type { Knex } from 'knex';
import { dialectOf } from '@server/db/dialect';

// Split payment: one order paid in parts (some cash, one card or two), each part a payment row of
// its own with its number (`payments.part`, 1 for an order paid at once). The old index allowed one
// live payment per order; now a part is paid at most once, and one card at a time runs per order.
// `orders.payment_method` gains 'split', and `orders.split_cash_cents` keeps the cash a split order
// took (total and tip, change given excluded) so the reports can tell cash from card without
// reading every payment. SQLite can't change a CHECK in place, so `orders` is rebuilt there (the
// documented way: foreign keys off, copy, drop, rename, indexes and triggers again, check), which
// needs no transaction around the migration: PRAGMA foreign_keys can't change inside one.
export const config = { transaction: false };

const OLD_LIVE = "CREATE UNIQUE INDEX payments_one_live_per_order ON payments (order_id) WHERE status IN ('processing', 'succeeded')";
const NEW_INDEXES = [
  // two card runs for one order at once could both charge; one waits for the other's outcome
  "CREATE UNIQUE INDEX payments_one_running_per_order ON payments (order_id) WHERE status = 'processing'",
  // a part is paid once, however many sends race
  "CREATE UNIQUE INDEX payments_one_paid_per_part ON payments (order_id, part) WHERE status = 'succeeded'",
];

const METHOD_CHECK = /CHECK \(`payment_method` in\('cash' , 'card'\)\)|check \(`payment_method` in \('cash', ?'card'(, ?'split')?\)\)/i;
const methodCheck = (methods: string[]) => `CHECK (\`payment_method\` in (${methods.map((m) => `'${m}'`).join(', ')}))`;

async function rebuildOrders(knex: Knex, methods: string[]) {
  await knex.raw('PRAGMA foreign_keys = OFF');
  try {
    await knex.transaction(async (trx) => {
      const [table] = (await trx.raw("SELECT sql FROM sqlite_master WHERE type = 'table' AND name = 'orders'")) as { sql: string }[];
      if (!METHOD_CHECK.test(table.sql)) throw new Error('The orders table has no payment_method check this migration knows');
      // indexes and triggers go with the dropped table, and a trigger of another table that reads
      // `orders` would stop the rename: all dropped, and made again after it
      const extras = (await trx.raw(
        "SELECT type, name, sql FROM sqlite_master WHERE sql IS NOT NULL AND ((tbl_name = 'orders' AND type = 'index') OR (type = 'trigger' AND (tbl_name = 'orders' OR sql LIKE '%orders%')))",
      )) as { type: string; name: string; sql: string }[];
      for (const t of extras.filter((e) => e.type === 'trigger')) await trx.raw(`DROP TRIGGER ${t.name}`);
      const createSql = table.sql.replace(/^CREATE TABLE [`"]?orders[`"]?/, 'CREATE TABLE `orders_next`').replace(METHOD_CHECK, methodCheck(methods));
      await trx.raw(createSql);
      await trx.raw('INSERT INTO orders_next SELECT * FROM orders');
      await trx.raw('DROP TABLE orders');
      await trx.raw('ALTER TABLE orders_next RENAME TO orders');
      for (const { sql } of extras) await trx.raw(sql);
      const broken = await trx.raw('PRAGMA foreign_key_check');
      if (broken.length > 0) throw new Error(`Foreign keys broken by the rebuild: ${JSON.stringify(broken)}`);
    });
  } finally {
    await knex.raw('PRAGMA foreign_keys = ON');
  }
}

async function payments(knex: Knex, up: boolean) {
  await knex.transaction(async (trx) => {
    if (up) {
      await trx.schema.alterTable('payments', (t) => t.integer('part').notNullable().defaultTo(1));
      await trx.schema.alterTable('orders', (t) => t.integer('split_cash_cents'));
      await trx.raw('DROP INDEX payments_one_live_per_order');
      for (const sql of NEW_INDEXES) await trx.raw(sql);
      return;
    }
    // The older schema has one paid payment per order: a split order can't be written back.
    const split = await trx('orders').where({ payment_method: 'split' }).first('id');
    if (split) throw new Error('Orders were paid in parts; the older schema has no place for them');
    await trx.raw('DROP INDEX payments_one_running_per_order');
    await trx.raw('DROP INDEX payments_one_paid_per_part');
    await trx.raw(OLD_LIVE);
    // in place on both databases (SQLite since 3.35), not through a copy of the table
    await trx.raw('ALTER TABLE orders DROP COLUMN split_cash_cents');
    await trx.raw('ALTER TABLE payments DROP COLUMN part');
  });
}

async function pgMethods(knex: Knex, methods: string[]) {
  await knex.transaction(async (trx) => {
    await trx.raw('ALTER TABLE orders DROP CONSTRAINT orders_payment_method_check');
    await trx.raw(`ALTER TABLE orders ADD CONSTRAINT orders_payment_method_check ${methodCheck(methods).replace(/`/g, '')}`);
  });
}

export async function up(knex: Knex): Promise<void> {
  if (dialectOf(knex) === 'postgres') await pgMethods(knex, ['cash', 'card', 'split']);
  else await rebuildOrders(knex, ['cash', 'card', 'split']);
  await payments(knex, true);
}

export async function down(knex: Knex): Promise<void> {
  await payments(knex, false);
  if (dialectOf(knex) === 'postgres') await pgMethods(knex, ['cash', 'card']);
  else await rebuildOrders(knex, ['cash', 'card']);
}
