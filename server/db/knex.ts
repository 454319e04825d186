// The one Knex instance over the SQLite file.
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import knexFactory, { type Knex } from 'knex';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

export const migrationConfig: Knex.MigratorConfig = {
  directory: path.join(root, 'migrations'),
  extension: 'ts',
  loadExtensions: ['.ts'],
};

export function createDb(filename: string): Knex {
  return knexFactory({
    client: 'better-sqlite3',
    connection: { filename },
    useNullAsDefault: true,
    migrations: migrationConfig,
    pool: {
      min: 1,
      max: 1, // SQLite has one writer; one connection keeps transactions strictly serial
      afterCreate(conn: { pragma: (sql: string) => unknown }, done: (err: Error | null, conn: unknown) => void) {
        try {
          conn.pragma('journal_mode = WAL');
          conn.pragma('synchronous = FULL'); // an acknowledged payment survives a power cut
          conn.pragma('foreign_keys = ON');
          conn.pragma('busy_timeout = 5000');
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
