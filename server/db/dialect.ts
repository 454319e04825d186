// Everything that differs between the two databases Jugline runs on lives here: SQLite (the
// embedded file, one café) and PostgreSQL (DATABASE_URL, a group of cafés). Services write the
// same Knex code for both and ask this module where the SQL has to differ.
import type { Knex } from 'knex';
import type { Db } from './knex';

export type Dialect = 'sqlite' | 'postgres';

/** A DATABASE_URL names PostgreSQL; anything else is the path of a SQLite file. */
export const isPostgresUrl = (target: string) => /^postgres(ql)?:\/\//i.test(target);

export function dialectOf(db: Db): Dialect {
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

/**
 * Seconds from `from` to `to` (timestamps stored as toISOString() text), rounded to the
 * millisecond, as a float: SQLite works it out through julianday, PostgreSQL through timestamptz.
 */
export function secondsBetweenSql(d: Dialect, from: string, to: string): string {
  return d === 'postgres'
    ? `ROUND(EXTRACT(EPOCH FROM (${to}::timestamptz - ${from}::timestamptz))::numeric, 3)::float8`
    : `ROUND((julianday(${to}) - julianday(${from})) * 86400, 3)`;
}

/**
 * The hour (0–23, an integer) of `column` (toISOString() text) moved by `shiftSql`, SQL that gives
 * a shift as SQLite's date modifiers write it ('+60 minutes', '-300 minutes'), which PostgreSQL
 * reads as an interval.
 */
export function shiftedHourSql(d: Dialect, column: string, shiftSql: string): string {
  return d === 'postgres'
    ? `CAST(EXTRACT(HOUR FROM (${column}::timestamptz AT TIME ZONE 'UTC') + CAST(${shiftSql} AS interval)) AS INTEGER)`
    : `CAST(strftime('%H', ${column}, ${shiftSql}) AS INTEGER)`;
}

/**
 * `column` contains the text bound as its one `?` (a LIKE pattern with `\` escaping % and _),
 * ignoring the case of ASCII letters only, as SQLite's LIKE does (sqlite.org/lang_expr.html#like);
 * on PostgreSQL ILIKE under the "C" collation, which folds ASCII letters only whatever the
 * database's locale.
 */
export function containsSql(d: Dialect, column: string): string {
  // ESCAPE: a `%`, `_` or `\` typed into a search is that character, never a wildcard (containing())
  return d === 'postgres' ? `${column} COLLATE "C" ILIKE ? ESCAPE '\\'` : `${column} LIKE ? ESCAPE '\\'`;
}

/** The pattern containsSql binds: `text` anywhere, its `%`, `_` and `\` escaped. */
export const containing = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/**
 * `expr` for ORDER BY ignoring the case of ASCII letters, otherwise by code point: SQLite's NOCASE
 * collation, and on PostgreSQL its equivalent, lower() under the "C" collation (ASCII-only folding,
 * byte order, which for UTF-8 is code point order).
 */
export function caseFoldedSql(d: Dialect, expr: string): string {
  return d === 'postgres' ? `lower(${expr} COLLATE "C")` : `${expr} COLLATE NOCASE`;
}

const jsonPath = (path: string[]) => `'$.${path.join('.')}'`;

/** The number at `path` inside the JSON text column `column` (null when missing), for SQL comparisons. */
export function jsonNumberSql(d: Dialect, column: string, path: string[]): string {
  return d === 'postgres' ? `(${column}::jsonb #>> '{${path.join(',')}}')::numeric` : `json_extract(${column}, ${jsonPath(path)})`;
}

/**
 * `column` (JSON) with top-level `keys` set to numbers, each given as SQL (bindings allowed):
 * SQLite's json_set, PostgreSQL's jsonb_set one key at a time, written back as json.
 */
export function jsonSetNumbersSql(d: Dialect, column: string, values: [key: string, sql: string][]): string {
  if (d !== 'postgres') return `json_set(${column}, ${values.map(([k, sql]) => `${jsonPath([k])}, ${sql}`).join(', ')})`;
  let out = `${column}::jsonb`;
  for (const [k, sql] of values) out = `jsonb_set(${out}, '{${k}}', to_jsonb(CAST(${sql} AS numeric)))`;
  return `${out}::json`;
}

/** The names of every table (Knex's migration bookkeeping included), sorted, for tests and tools. */
export async function tableNames(db: Knex): Promise<string[]> {
  const rows =
    dialectOf(db) === 'postgres'
      ? await db('information_schema.tables')
          .where({ table_schema: db.raw('current_schema()'), table_type: 'BASE TABLE' })
          .pluck('table_name')
      : await db('sqlite_master').where({ type: 'table' }).whereNot('name', 'like', 'sqlite_%').pluck('name');
  return (rows as string[]).sort();
}

/**
 * `query` (a SELECT inside a transaction) locks the rows it reads until the transaction ends, so
 * a command's read-then-write on them can't interleave with another's. PostgreSQL: FOR NO KEY
 * UPDATE (rows that merely reference them can still be inserted). SQLite needs nothing: its one
 * connection already runs transactions one after another.
 */
export function lockingRead<Q extends Knex.QueryBuilder>(db: Db, query: Q): Q {
  return (dialectOf(db) === 'postgres' ? query.forNoKeyUpdate() : query) as Q;
}

/**
 * Holds the café's `dates` (YYYY-MM-DD) until the transaction ends, before a report works them out
 * to store them: on PostgreSQL an exclusive advisory lock per day, the one a change to that day's
 * orders takes shared in its trigger (migration 20261203000100), so neither can slip between the
 * other's reading and writing. SQLite runs transactions one at a time and needs none.
 */
export async function lockReportDays(trx: Knex.Transaction, locationId: number, dates: string[]): Promise<void> {
  if (dialectOf(trx) !== 'postgres' || dates.length === 0) return;
  // the day as a number (20260302); taken in date order, unnest keeps the array's
  const keys = dates.map((d) => Number(d.replaceAll('-', ''))).sort((a, b) => a - b);
  await trx.raw('SELECT pg_advisory_xact_lock(?::integer, d) FROM unnest(?::integer[]) AS d', [locationId, `{${keys.join(',')}}`]);
}
