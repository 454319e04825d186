// Everything that differs between the two databases Jugline runs on lives here: SQLite (the
// embedded file, one café) and PostgreSQL (DATABASE_URL, a group of cafés). Services write the
// same Knex code for both and ask this module where the SQL has to differ.
import type { Knex } from 'knex';

export type Dialect = 'sqlite' | 'postgres';

/** A DATABASE_URL names PostgreSQL; anything else is the path of a SQLite file. */
export const isPostgresUrl = (target: string) => /^postgres(ql)?:\/\//i.test(target);

export function dialectOf(db: Knex | Knex.Transaction): Dialect {
  const client = (db as unknown as { client: { config: { client: unknown } } }).client.config.client;
  return client === 'pg' ? 'postgres' : 'sqlite';
}

/**
 * A unique or primary-key violation, so callers can answer 409: SQLite's extended codes through
 * better-sqlite3, PostgreSQL's SQLSTATE 23505 through pg.
 */
export function isUniqueViolation(err: unknown): boolean {
  const code = (err as { code?: unknown } | null | undefined)?.code;
  return code === 'SQLITE_CONSTRAINT_UNIQUE' || code === 'SQLITE_CONSTRAINT_PRIMARYKEY' || code === '23505';
}

/**
 * The database could not take the work now (503 with Retry-After): SQLite's SQLITE_BUSY or
 * SQLITE_LOCKED (or an extended code of theirs) past the busy timeout; on PostgreSQL a deadlock
 * (40P01), a serialisation failure (40001), a lock or statement timeout (55P03, 57014) or too many
 * connections (53300). Each leaves the database as it was: the transaction was rolled back.
 */
export function isDatabaseBusy(err: unknown): boolean {
  const code = (err as { code?: unknown } | null | undefined)?.code;
  if (typeof code !== 'string') return false;
  return /^SQLITE_(BUSY|LOCKED)(_|$)/.test(code) || ['40P01', '40001', '55P03', '57014', '53300'].includes(code);
}

/** The rows of a `db.raw(...)` SELECT: better-sqlite3 answers an array, pg a result with `rows`. */
export function rawRows<T>(result: unknown): T[] {
  if (Array.isArray(result)) return result as T[];
  return ((result as { rows?: T[] } | null | undefined)?.rows ?? []) as T[];
}

/**
 * A read of several statements that must see one moment (the board and its sequence number).
 * SQLite's transaction already reads one snapshot; PostgreSQL's default, read committed, gives each
 * statement its own, so there the transaction asks for repeatable read.
 */
export function snapshotRead(db: Knex): Knex.TransactionConfig | undefined {
  return dialectOf(db) === 'postgres' ? { isolationLevel: 'repeatable read' } : undefined;
}
