// Another program holding the SQLite write lock on a database file, the way a maintenance script
// or the sqlite3 shell in the middle of a transaction would: a separate node process with its own
// better-sqlite3 connection that runs BEGIN EXCLUSIVE and holds it until told to let go.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { isPostgresUrl } from '@server/db/dialect';

const ROOT = path.resolve(import.meta.dirname, '../..');

// CommonJS on purpose: `node -e` resolves require() from the working directory's node_modules.
const HOLDER = `
const Database = require('better-sqlite3');
const db = new Database(process.argv[1]);
db.exec('BEGIN EXCLUSIVE');
process.stdout.write('locked\\n');
process.stdin.once('data', () => {
  db.exec('COMMIT');
  db.close();
  process.stdout.write('released\\n');
  process.exit(0);
});
`;

// The same on PostgreSQL: every table of the database locked in EXCLUSIVE mode, which lets plain
// reads through and makes every write wait (until the app's lock_timeout answers 55P03).
const PG_HOLDER = `
const { Client } = require('pg');
const client = new Client({ connectionString: process.argv[1] });
(async () => {
  await client.connect();
  await client.query('BEGIN');
  const { rows } = await client.query("SELECT tablename FROM pg_tables WHERE schemaname = current_schema()");
  for (const { tablename } of rows) await client.query('LOCK TABLE "' + tablename + '" IN EXCLUSIVE MODE');
  process.stdout.write('locked\\n');
  process.stdin.once('data', async () => {
    await client.query('COMMIT');
    await client.end();
    process.stdout.write('released\\n');
    process.exit(0);
  });
})().catch((err) => {
  process.stderr.write(String(err));
  process.exit(1);
});
`;

export interface HeldLock {
  /** Commits the empty transaction and waits for the holding process to exit. */
  release(): Promise<void>;
}

/** Resolves once the second process holds the lock; `target` is a SQLite file or a postgres:// URL. */
export function holdWriteLock(target: string): Promise<HeldLock> {
  const holder = isPostgresUrl(target) ? PG_HOLDER : HOLDER;
  const child = spawn(process.execPath, ['-e', holder, target], { cwd: ROOT, stdio: ['pipe', 'pipe', 'pipe'] });
  let out = '';
  let err = '';
  child.stderr.on('data', (d) => (err += d));
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  return new Promise((resolve, reject) => {
    child.stdout.on('data', (d) => {
      out += d;
      if (out.includes('locked\n') && !out.includes('released')) {
        resolve({
          async release() {
            child.stdin.end('release\n');
            const code = await exited;
            if (code !== 0) throw new Error(`the lock holder exited with ${code}: ${err}`);
          },
        });
      }
    });
    exited.then((code) => reject(new Error(`the lock holder exited with ${code} before locking: ${err}`)));
  });
}
