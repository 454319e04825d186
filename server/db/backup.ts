// Backup and restore of a café's database, safe to back up while the server runs:
// - SQLite: SQLite's online backup API (through better-sqlite3); restore copies the file back.
// - PostgreSQL: pg_dump's custom archive (one consistent snapshot); restore with pg_restore
//   --clean in one transaction, so a failed restore leaves the database as it was.
// Either way a backup is checked (it opens, and holds the orders table) before it replaces anything.
import { execFile } from 'node:child_process';
import { closeSync, copyFileSync, existsSync, mkdirSync, openSync, readSync, rmSync } from 'node:fs';
import path from 'node:path';
import { promisify } from 'node:util';
import Database from 'better-sqlite3';
import { isPostgresUrl } from './dialect';
import { postgresTool } from './postgres-tools';

const run = promisify(execFile);
// an archive's data section can be far larger than execFile's 1 MB default
const BIG_OUTPUT = { maxBuffer: 1024 * 1024 * 1024 };

/** The file name a backup of this database gets by default. */
export const backupFileName = (target: string, stamp: string) => `jugline-${stamp}.${isPostgresUrl(target) ? 'pgdump' : 'sqlite'}`;

/** Back up the database at `target` (a SQLite file or a postgres:// URL) into `destination`. */
export async function backupDatabase(target: string, destination: string): Promise<string> {
  mkdirSync(path.dirname(destination), { recursive: true });
  if (isPostgresUrl(target)) {
    await run(postgresTool('pg_dump'), ['--format=custom', '--no-owner', '--no-privileges', `--file=${destination}`, `--dbname=${target}`]);
    return destination;
  }
  const db = new Database(target, { fileMustExist: true });
  try {
    await db.backup(destination);
  } finally {
    db.close();
  }
  return destination;
}

/** Check a backup opens and holds a Jugline database; says how many orders it holds. */
export async function checkBackup(file: string): Promise<{ orders: number }> {
  if (!existsSync(file)) throw new Error(`${file}: no such backup`);
  return isPostgresArchive(file) ? checkPostgresArchive(file) : checkSqliteFile(file);
}

function checkSqliteFile(file: string): { orders: number } {
  const db = new Database(file, { readonly: true, fileMustExist: true });
  try {
    const integrity = db.pragma('integrity_check', { simple: true });
    if (integrity !== 'ok') throw new Error(`${file} fails SQLite's integrity check: ${integrity}`);
    const row = db.prepare('SELECT count(*) AS n FROM orders').get() as { n: number };
    return { orders: row.n };
  } finally {
    db.close();
  }
}

async function checkPostgresArchive(file: string): Promise<{ orders: number }> {
  // the orders table's data as pg_restore would load it: a COPY block, one line per row
  const { stdout } = await run(postgresTool('pg_restore'), ['--data-only', '--table=orders', '--file=-', file], BIG_OUTPUT);
  const lines = stdout.split('\n');
  const start = lines.findIndex((l) => l.startsWith('COPY public.orders '));
  if (start < 0) throw new Error(`${file} is a PostgreSQL archive without Jugline's orders table`);
  const end = lines.indexOf('\\.', start);
  return { orders: end - start - 1 };
}

/** pg_dump's custom archives begin with "PGDMP"; SQLite files with "SQLite format 3". */
function isPostgresArchive(file: string): boolean {
  const head = Buffer.alloc(5);
  const fd = openSync(file, 'r');
  try {
    readSync(fd, head, 0, 5, 0);
  } finally {
    closeSync(fd);
  }
  return head.toString('latin1') === 'PGDMP';
}

/**
 * With the server stopped: put the backup in place of the database at `target`. A SQLite backup
 * goes onto a SQLite file, a PostgreSQL archive into a PostgreSQL database, never crosswise.
 */
export async function restoreDatabase(backupFile: string, target: string): Promise<void> {
  await checkBackup(backupFile);
  const archive = isPostgresArchive(backupFile);
  if (archive !== isPostgresUrl(target)) {
    throw new Error(`${backupFile} is a ${archive ? 'PostgreSQL' : 'SQLite'} backup; it restores only onto a ${archive ? 'PostgreSQL' : 'SQLite'} database`);
  }
  if (archive) {
    await run(
      postgresTool('pg_restore'),
      ['--clean', '--if-exists', '--no-owner', '--no-privileges', '--single-transaction', '--exit-on-error', `--dbname=${target}`, backupFile],
      BIG_OUTPUT,
    );
    return;
  }
  for (const suffix of ['-wal', '-shm']) if (existsSync(target + suffix)) rmSync(target + suffix);
  mkdirSync(path.dirname(target), { recursive: true });
  copyFileSync(backupFile, target);
}
