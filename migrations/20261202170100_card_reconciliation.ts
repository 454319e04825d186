import type { Knex } from 'knex';
import { dialectOf } from '@server/db/dialect';

// Card money reconciliation. A card attempt whose answer was lost is `unknown` until the provider
// says what happened; a charge the order can't take (voided, paid another way, a duplicate) is
// `refunding` and then `refunded`, given back by Jugline itself. Such a refund has no person
// behind it (`created_by` null) and says why in `cause`; one automatic refund per attempt.
// SQLite can't change a CHECK or a NOT NULL in place, so both tables are rebuilt (the documented
// twelve-step way: foreign keys off, copy, drop, rename, check). That needs no transaction
// around the migration: PRAGMA foreign_keys can't change inside one.
export const config = { transaction: false };

const PAYMENTS = (statuses: string[]) => `CREATE TABLE \`payments_next\` (
  \`id\` integer not null primary key autoincrement,
  \`order_id\` integer not null,
  \`method\` varchar(10) not null check (\`method\` in ('cash','card')),
  \`status\` varchar(12) not null check (\`status\` in (${statuses.map((s) => `'${s}'`).join(',')})),
  \`amount_cents\` integer not null,
  \`tendered_cents\` integer,
  \`change_cents\` integer,
  \`provider_id\` varchar(64),
  \`decline_code\` varchar(40),
  \`message\` varchar(200),
  \`created_at\` varchar(255) not null,
  \`updated_at\` varchar(255) not null,
  foreign key(\`order_id\`) references \`orders\`(\`id\`))`;
const PAYMENT_COLUMNS = 'id, order_id, method, status, amount_cents, tendered_cents, change_cents, provider_id, decline_code, message, created_at, updated_at';
const OLD_STATUSES = ['processing', 'succeeded', 'declined', 'failed', 'canceled'];
const NEW_STATUSES = [...OLD_STATUSES, 'unknown', 'refunding', 'refunded'];

/** The refunds table with automatic refunds (`withCause`: created_by may be null) or as it was. */
const REFUNDS = (withCause: boolean) => `CREATE TABLE \`refunds_next\` (
  \`id\` integer not null primary key autoincrement,
  \`order_id\` integer not null,
  \`payment_id\` integer not null,
  \`amount_cents\` integer not null,
  \`reason\` varchar(200) not null,
  \`provider_id\` varchar(64),
  ${
    withCause
      ? `\`created_by\` integer,
  \`cause\` varchar(16) check (\`cause\` in ('order_voided','paid_otherwise','duplicate')),
  \`created_at\` varchar(255) not null,
  check ((\`cause\` is null) <> (\`created_by\` is null)),`
      : `\`created_by\` integer not null,
  \`created_at\` varchar(255) not null,`
  }
  foreign key(\`order_id\`) references \`orders\`(\`id\`),
  foreign key(\`payment_id\`) references \`payments\`(\`id\`),
  foreign key(\`created_by\`) references \`users\`(\`id\`))`;
const REFUND_COLUMNS = 'id, order_id, payment_id, amount_cents, reason, provider_id, created_by, created_at';

async function rebuild(knex: Knex, change: (trx: Knex.Transaction) => Promise<void>) {
  await knex.raw('PRAGMA foreign_keys = OFF');
  try {
    await knex.transaction(async (trx) => {
      await change(trx);
      const broken = await trx.raw('PRAGMA foreign_key_check');
      if (broken.length > 0) throw new Error(`Foreign keys broken by the rebuild: ${JSON.stringify(broken)}`);
    });
  } finally {
    await knex.raw('PRAGMA foreign_keys = ON');
  }
}

async function swap(trx: Knex.Transaction, table: string, createSql: string, selectSql: string, indexes: string[]) {
  await trx.raw(createSql);
  await trx.raw(`INSERT INTO ${table}_next SELECT ${selectSql} FROM ${table}`);
  await trx.raw(`DROP TABLE ${table}`);
  await trx.raw(`ALTER TABLE ${table}_next RENAME TO ${table}`);
  for (const sql of indexes) await trx.raw(sql);
}

const PAYMENT_INDEXES = [
  'CREATE INDEX `payments_order_id_index` on `payments` (`order_id`)',
  "CREATE UNIQUE INDEX payments_one_live_per_order ON payments (order_id) WHERE status IN ('processing', 'succeeded')",
];

// PostgreSQL (DATABASE_URL; SQLite sees exactly the rebuild above) changes the constraints in place,
// in a transaction of its own (this migration runs without one).
const pgStatuses = (statuses: string[]) => statuses.map((s) => `'${s}'`).join(', ');
const PG_UP = [
  'ALTER TABLE payments DROP CONSTRAINT payments_status_check',
  `ALTER TABLE payments ADD CONSTRAINT payments_status_check CHECK (status IN (${pgStatuses(NEW_STATUSES)}))`,
  'CREATE INDEX payments_created_at_index ON payments (created_at)',
  'ALTER TABLE refunds ALTER COLUMN created_by DROP NOT NULL',
  "ALTER TABLE refunds ADD COLUMN cause varchar(16) CHECK (cause IN ('order_voided', 'paid_otherwise', 'duplicate'))",
  'ALTER TABLE refunds ADD CONSTRAINT refunds_cause_or_person CHECK ((cause IS NULL) <> (created_by IS NULL))',
  'CREATE INDEX refunds_created_at_index ON refunds (created_at)',
  'CREATE UNIQUE INDEX refunds_one_automatic_per_payment ON refunds (payment_id) WHERE cause IS NOT NULL',
];
const PG_DOWN = [
  'DROP INDEX refunds_one_automatic_per_payment',
  'DROP INDEX refunds_created_at_index',
  'DELETE FROM refunds WHERE cause IS NOT NULL',
  'ALTER TABLE refunds DROP CONSTRAINT refunds_cause_or_person',
  'ALTER TABLE refunds DROP COLUMN cause',
  'ALTER TABLE refunds ALTER COLUMN created_by SET NOT NULL',
  'DROP INDEX payments_created_at_index',
  "UPDATE payments SET status = 'failed' WHERE status IN ('unknown', 'refunding', 'refunded')",
  'ALTER TABLE payments DROP CONSTRAINT payments_status_check',
  `ALTER TABLE payments ADD CONSTRAINT payments_status_check CHECK (status IN (${pgStatuses(OLD_STATUSES)}))`,
];
async function pgSteps(knex: Knex, steps: string[]) {
  await knex.transaction(async (trx) => {
    for (const sql of steps) await trx.raw(sql);
  });
}

export async function up(knex: Knex): Promise<void> {
  if (dialectOf(knex) === 'postgres') return pgSteps(knex, PG_UP);
  await rebuild(knex, async (trx) => {
    await swap(trx, 'payments', PAYMENTS(NEW_STATUSES), PAYMENT_COLUMNS, [
      ...PAYMENT_INDEXES,
      // the card check reads a day's attempts by when they were made
      'CREATE INDEX `payments_created_at_index` on `payments` (`created_at`)',
    ]);
    await swap(trx, 'refunds', REFUNDS(true), `${REFUND_COLUMNS.replace('created_by, created_at', 'created_by, NULL, created_at')}`, [
      'CREATE INDEX `refunds_order_id_index` on `refunds` (`order_id`)',
      'CREATE INDEX `refunds_created_at_index` on `refunds` (`created_at`)',
      // two paths that learn of one stray charge at once can't both give it back
      'CREATE UNIQUE INDEX refunds_one_automatic_per_payment ON refunds (payment_id) WHERE cause IS NOT NULL',
    ]);
  });
}

export async function down(knex: Knex): Promise<void> {
  if (dialectOf(knex) === 'postgres') return pgSteps(knex, PG_DOWN);
  await rebuild(knex, async (trx) => {
    // The older tables have no place for automatic refunds or the new attempt states.
    await trx('refunds').whereNotNull('cause').delete();
    await swap(trx, 'refunds', REFUNDS(false), REFUND_COLUMNS, ['CREATE INDEX `refunds_order_id_index` on `refunds` (`order_id`)']);
    await trx('payments').whereIn('status', ['unknown', 'refunding', 'refunded']).update({ status: 'failed' });
    await swap(trx, 'payments', PAYMENTS(OLD_STATUSES), PAYMENT_COLUMNS, PAYMENT_INDEXES);
  });
}
