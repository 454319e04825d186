// The one Knex instance: over the SQLite file (the default, one café), or over PostgreSQL when
// the target is a postgres:// URL (DATABASE_URL, a group of cafés).
import { readdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import knexFactory, { type Knex } from 'knex';
import { isPostgresUrl } from './dialect';
import { PROJECT_ROOT } from '@server/root';

// `npm start` runs the server compiled ahead of time (dist/app, scripts/build-server.ts), where
// this module is part of a .js bundle; tests, scripts and `npm run dev` run the sources through tsx.
const HERE = fileURLToPath(import.meta.url);
const COMPILED = HERE.endsWith('.js');
const SOURCES = path.join(PROJECT_ROOT, 'migrations');
// beside the bundle: <dist>/app/server/index.js (or the bench's <dist>/app/bench/…) → <dist>/app/migrations
const BUILT = path.resolve(path.dirname(HERE), '../migrations');

/**
 * The migrations, named by their source file (`…_menu.ts`) either way: that name is what the
 * knex_migrations table records, so a database migrated by the sources is current for the
 * compiled server and the other way round. The compiled server imports the .js beside its bundle.
 */
class Migrations implements Knex.MigrationSource<{ file: string; directory: string }> {
  async getMigrations() {
    return readdirSync(SOURCES)
      .filter((f) => f.endsWith('.ts'))
      .sort()
      .map((file) => ({ file, directory: SOURCES }));
  }
  getMigrationName(m: { file: string }) {
    return m.file;
  }
  getMigration(m: { file: string }): Promise<Knex.Migration> {
    const file = COMPILED ? path.join(BUILT, m.file.replace(/\.ts$/, '.js')) : path.join(SOURCES, m.file);
    return import(pathToFileURL(file).href);
  }
}

export const migrationConfig: Knex.MigratorConfig = { migrationSource: new Migrations() };

/** What a read or write runs on: the database, or a command's transaction. */
export type Db = Knex | Knex.Transaction;

/** How long a statement waits for another process's write lock before SQLite answers SQLITE_BUSY (PostgreSQL: lock_timeout). */
export const DEFAULT_BUSY_TIMEOUT_MS = 5000;

export interface DbOptions {
  busyTimeoutMs?: number;
  /** PostgreSQL connections per process; unset: 10 (pg's default). */
  poolMax?: number;
}

/** `target` is a SQLite file path or a postgres:// URL. */
export function createDb(target: string, opts: DbOptions = {}): Knex {
  return isPostgresUrl(target) ? createPostgresDb(target, opts) : createSqliteDb(target, opts);
}

function createPostgresDb(connectionString: string, opts: DbOptions): Knex {
  const lockTimeoutMs = Math.trunc(opts.busyTimeoutMs ?? DEFAULT_BUSY_TIMEOUT_MS);
  return knexFactory({
    client: 'pg',
    connection: { connectionString },
    migrations: migrationConfig,
    pool: {
      min: 0,
      max: opts.poolMax ?? 10,
      // SQLite's busy timeout on PostgreSQL: a statement waits this long for a lock another
      // connection holds, then fails with 55P03 (a 503, errors.ts) instead of waiting forever
      afterCreate(conn: { query: (sql: string, cb: (err: Error | null) => void) => void }, done: (err: Error | null, conn: unknown) => void) {
        conn.query(`SET lock_timeout = ${lockTimeoutMs}`, (err) => done(err, conn));
      },
    },
  });
}

/** Statements kept prepared per SQLite connection, the least recently used dropped first. */
export const STATEMENT_CACHE_SIZE = 500;

interface SqliteConnection {
  pragma(sql: string): unknown;
  prepare(sql: string): unknown;
}

/**
 * Knex prepares every statement anew each time it runs it (its better-sqlite3 client calls
 * `prepare` per query): about a tenth of the server's time on an order. The connection keeps its
 * prepared statements by their SQL instead; the bindings differ per run, the statement not.
 * better-sqlite3 resets a statement after each run, and SQLite prepares it again by itself when
 * a migration changed the schema under it. better-sqlite3's own calls (pragma, transaction) go
 * past this `prepare`, and nothing here sets a statement's modes (safeIntegers, raw, pluck),
 * so a kept statement runs exactly as a fresh one.
 */
export function keepPreparedStatements(conn: SqliteConnection, size = STATEMENT_CACHE_SIZE): void {
  const prepare = conn.prepare.bind(conn);
  const kept = new Map<string, unknown>();
  conn.prepare = (sql: string) => {
    let statement = kept.get(sql);
    if (statement)
      kept.delete(sql); // to the back: most recently used
    else {
      statement = prepare(sql);
      if (kept.size >= size) kept.delete(kept.keys().next().value!);
    }
    kept.set(sql, statement);
    return statement;
  };
}

function createSqliteDb(filename: string, opts: DbOptions): Knex {
  const busyTimeoutMs = Math.trunc(opts.busyTimeoutMs ?? DEFAULT_BUSY_TIMEOUT_MS);
  return knexFactory({
    client: 'better-sqlite3',
    connection: { filename },
    useNullAsDefault: true,
    migrations: migrationConfig,
    pool: {
      min: 1,
      max: 1, // SQLite has one writer; one connection keeps transactions strictly serial
      afterCreate(conn: SqliteConnection, done: (err: Error | null, conn: unknown) => void) {
        try {
          keepPreparedStatements(conn);
          conn.pragma('journal_mode = WAL');
          conn.pragma('synchronous = FULL'); // an acknowledged payment survives a power cut
          conn.pragma('foreign_keys = ON');
          // better-sqlite3 is synchronous: the whole process waits this long (then a 503, errors.ts)
          conn.pragma(`busy_timeout = ${busyTimeoutMs}`);
          done(null, conn);
        } catch (err) {
          done(err as Error, conn);
        }
      },
    },
  });
}

export async function migrate(db: Knex): Promise<void> {
  await db.migrate.latest(migrationConfig);
}

export const nowIso = (clock: () => Date) => clock().toISOString();
