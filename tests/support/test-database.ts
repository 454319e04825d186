// Where a test server keeps its data: a fresh SQLite file in its folder (the `server` project), or
// on the PostgreSQL leg (`server-pg`) a database of its own cloned from the migrated and seeded
// template the globalSetup made (tests/support/pg-global-setup.ts), dropped when the server closes.
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { inject } from 'vitest';
import { adminQuery } from '@scripts/services/postgres';
import { TEMPLATE_DATABASE } from './pg-global-setup';

export interface TestDatabase {
  /** postgres://… on the PostgreSQL leg; undefined on SQLite. */
  databaseUrl?: string;
  drop(): Promise<void>;
}

/** The PostgreSQL leg's admin URL, or undefined when this run is on SQLite. */
export const testPostgresAdminUrl = (): string | undefined => inject('pgAdminUrl');

export async function createTestDatabase(): Promise<TestDatabase> {
  const adminUrl = testPostgresAdminUrl();
  if (!adminUrl) return { drop: async () => {} };
  const name = newName();
  await cloneTemplate(adminUrl, name);
  return postgresDatabase(adminUrl, name);
}

/**
 * An empty database, not migrated: what createDb opens (a file in `dir` on SQLite, a postgres://
 * URL on the PostgreSQL leg), for tests of the migration step itself.
 */
export async function createEmptyDatabase(dir: string): Promise<{ target: string; drop(): Promise<void> }> {
  const adminUrl = testPostgresAdminUrl();
  if (!adminUrl) return { target: path.join(dir, `empty-${randomBytes(4).toString('hex')}.sqlite`), drop: async () => {} };
  const name = newName();
  await adminQuery(adminUrl, `CREATE DATABASE ${name}`);
  const db = postgresDatabase(adminUrl, name);
  return { target: db.databaseUrl!, drop: db.drop };
}

const newName = () => `t_${process.pid}_${randomBytes(6).toString('hex')}`;

function postgresDatabase(adminUrl: string, name: string): TestDatabase {
  return {
    databaseUrl: adminUrl.replace(/\/[^/]*$/, `/${name}`),
    drop: () => adminQuery(adminUrl, `DROP DATABASE IF EXISTS ${name} WITH (FORCE)`),
  };
}

async function cloneTemplate(adminUrl: string, name: string) {
  // CREATE DATABASE … TEMPLATE refuses while another clone of the same template is starting
  // ("source database is being accessed by other users"): try again shortly
  for (let attempt = 0; ; attempt++) {
    try {
      await adminQuery(adminUrl, `CREATE DATABASE ${name} TEMPLATE ${TEMPLATE_DATABASE}`);
      return;
    } catch (err) {
      if ((err as { code?: string }).code !== '55006' || attempt >= 50) throw err;
      await new Promise((r) => setTimeout(r, 50 + Math.random() * 100));
    }
  }
}
