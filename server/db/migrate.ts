// Migrating (and seeding the demo café into an empty database) as one step that two processes
// may start at once. On PostgreSQL it runs under an advisory lock: the second waits for the first
// and then finds nothing left to do. On SQLite the second meets Knex's migration lock or a busy
// database and tries again until the first is done.
import Database from 'better-sqlite3';
import type { Knex } from 'knex';
import { seedDemoCafeIfEmpty } from '@seeds/demo-cafe';
import { dialectOf, isDatabaseBusy } from './dialect';
import { migrate, migrationConfig } from './knex';

/** Any fixed number: the advisory lock Jugline's migrations and seed run under ("jugl" in ASCII; a
 * longer one would pass 2^53 and not be the number written here). */
const MIGRATION_LOCK = 0x6a75676c;

export interface PreparedDatabase {
  migrated: number;
  seeded: boolean;
}

export async function migrateAndSeed(db: Knex, opts: { seedDemo: boolean }): Promise<PreparedDatabase> {
  return underMigrationLock(db, async () => {
    const [, pending] = (await db.migrate.list(migrationConfig)) as [unknown[], unknown[]];
    await migrate(db);
    const seeded = opts.seedDemo && (await seedDemoCafeIfEmpty(db)) !== null;
    return { migrated: pending.length, seeded };
  });
}

/** SQLite: how often, and how long apart, a second process tries again while the first migrates. */
const SQLITE_TRIES = 120;
const SQLITE_WAIT_MS = 250;

/** Start-up without migrating: refuse a database that is behind the code, naming the step to run. */
export async function requireMigrated(db: Knex): Promise<void> {
  const [, pending] = (await db.migrate.list(migrationConfig)) as [unknown[], { file?: string; name?: string }[]];
  if (pending.length > 0) {
    const names = pending.map((m) => m.file ?? m.name ?? String(m)).join(', ');
    throw new DatabaseBehindError(
      `The database is missing ${pending.length} migration(s) (${names}): run \`npm run db:migrate\` first, or set MIGRATE_ON_START=true.`,
    );
  }
}

export class DatabaseBehindError extends Error {}

async function underMigrationLock<T>(db: Knex, work: () => Promise<T>): Promise<T> {
  if (dialectOf(db) !== 'postgres') return underSqliteLock(db, () => retryWhileLocked(work));
  // a session-level lock on a connection of its own; the migrations use the pool's others
  const client = db.client as { acquireConnection(): Promise<PgConnection>; releaseConnection(c: PgConnection): Promise<void> };
  const conn = await client.acquireConnection();
  try {
    await conn.query('SELECT pg_advisory_lock($1)', [MIGRATION_LOCK]);
    try {
      return await work();
    } finally {
      await conn.query('SELECT pg_advisory_unlock($1)', [MIGRATION_LOCK]);
    }
  } finally {
    await client.releaseConnection(conn);
  }
}

interface PgConnection {
  query(sql: string, values: unknown[]): Promise<unknown>;
}

/**
 * Another process is at it; wait: Knex's "Migration table is already locked", SQLite busy, or
 * Knex's own tables created by the other process between our check and our CREATE.
 */
const anotherIsMigrating = (err: unknown) =>
  (err as { name?: string })?.name === 'MigrationLocked' ||
  isDatabaseBusy(err) ||
  /table `?knex_migrations(_lock)?`? already exists/.test((err as Error)?.message ?? '');

async function retryWhileLocked<T>(work: () => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await work();
    } catch (err) {
      if (!anotherIsMigrating(err) || attempt >= SQLITE_TRIES) throw err;
      await new Promise((r) => setTimeout(r, SQLITE_WAIT_MS));
    }
  }
}

/**
 * SQLite: the whole step under an exclusive transaction on a small lock file beside the database
 * (`<file>.migrate-lock`), so a second process waits for the first; SQLite lets the lock go by
 * itself if the process dies.
 */
async function underSqliteLock<T>(db: Knex, work: () => Promise<T>): Promise<T> {
  const filename = (db.client as { config: { connection?: { filename?: string } } }).config.connection?.filename;
  if (!filename || filename === ':memory:') return work();
  const lock = new Database(`${filename}.migrate-lock`);
  try {
    // better-sqlite3 waits synchronously: ask without waiting and poll, so this process runs on
    await retryWhileLocked(async () => lock.exec('BEGIN EXCLUSIVE'));
    try {
      return await work();
    } finally {
      lock.exec('COMMIT');
    }
  } finally {
    lock.close();
  }
}
