// Where Debian's PostgreSQL programs are: PG_BIN, or the newest /usr/lib/postgresql/<version>/bin.
// The versioned folder, not /usr/bin: pg_dump must be at least as new as the server it reads, and
// initdb/postgres are only there. Used by db:backup/db:restore and by the tests' throwaway cluster.
import { existsSync, readdirSync } from 'node:fs';
import path from 'node:path';

export const MISSING_POSTGRES =
  'This needs PostgreSQL from Debian: apt-get install postgresql ' +
  '(only the programs in /usr/lib/postgresql/<version>/bin are used; no service has to run). ' +
  'Or point PG_BIN at a folder holding them.';

/** The folder holding initdb, postgres, pg_dump and pg_restore. */
export function postgresBin(env: NodeJS.ProcessEnv = process.env): string {
  if (env.PG_BIN) {
    if (!existsSync(path.join(env.PG_BIN, 'initdb'))) throw new Error(`PG_BIN=${env.PG_BIN} holds no initdb. ${MISSING_POSTGRES}`);
    return env.PG_BIN;
  }
  const root = '/usr/lib/postgresql';
  const versions = existsSync(root)
    ? readdirSync(root)
        .filter((v) => existsSync(path.join(root, v, 'bin', 'initdb')))
        .sort((a, b) => Number(b) - Number(a))
    : [];
  if (versions.length === 0) throw new Error(MISSING_POSTGRES);
  return path.join(root, versions[0], 'bin');
}

/** The full path of one PostgreSQL program. */
export const postgresTool = (name: 'initdb' | 'postgres' | 'pg_dump' | 'pg_restore', env: NodeJS.ProcessEnv = process.env) => path.join(postgresBin(env), name);
