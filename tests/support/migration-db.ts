// A real SQLite file migrated up to, not including, one migration, for the tests of that migration.
// Each test file calls `migrationDatabases()` once; the files it made are closed and removed after
// every test.
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Knex } from 'knex';
import { afterEach } from 'vitest';
import { createDb, migrationConfig } from '@server/db/knex';

export function migrationDatabases() {
  const open: { db: Knex; dir: string }[] = [];
  afterEach(async () => {
    for (const { db, dir } of open.splice(0)) {
      await db.destroy();
      rmSync(dir, { recursive: true, force: true });
    }
  });
  /** A new database with every migration before `migration` applied, one at a time. */
  return async function before(migration: string): Promise<Knex> {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-migration-'));
    const db = createDb(path.join(dir, 'jugline.sqlite'));
    open.push({ db, dir });
    for (;;) {
      const [, pending] = (await db.migrate.list(migrationConfig)) as [unknown[], { file: string }[]];
      if (pending[0].file === migration) return db;
      await db.migrate.up(migrationConfig);
    }
  };
}
