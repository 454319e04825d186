// Online backup with SQLite's backup API (through better-sqlite3), safe while the server runs,
// and a restore that puts a backup in place of the database file.
import { copyFileSync, existsSync, mkdirSync, rmSync } from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';

export async function backupDatabase(databaseFile: string, destination: string): Promise<string> {
  mkdirSync(path.dirname(destination), { recursive: true });
  const db = new Database(databaseFile, { fileMustExist: true });
  try {
    await db.backup(destination);
  } finally {
    db.close();
  }
  return destination;
}

/** Check a backup opens and holds a Jugline database, before it replaces anything. */
export function checkBackup(file: string): { orders: number } {
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

/** With the server stopped: replace the database (and drop its old WAL files) with the backup. */
export function restoreDatabase(backupFile: string, databaseFile: string): void {
  checkBackup(backupFile);
  for (const suffix of ['-wal', '-shm']) if (existsSync(databaseFile + suffix)) rmSync(databaseFile + suffix);
  mkdirSync(path.dirname(databaseFile), { recursive: true });
  copyFileSync(backupFile, databaseFile);
}
