// Where the bench's servers keep their data: fresh SQLite files in the run's temp folder, or with
// `--db postgres` fresh databases in a throwaway PostgreSQL cluster (scripts/services/postgres.ts)
// that the bench starts and removes. Each server process gets a database of its own by name.
import path from 'node:path';
import { adminQuery, startCluster, type PgCluster } from '@scripts/services/postgres';

export type BenchDb = 'sqlite' | 'postgres';

export interface BenchDatabases {
  db: BenchDb;
  /** A new, empty database: a file path, or a postgres:// URL. */
  create(name: string): Promise<string>;
  /** The server child's environment for that database (bench/jugline-server.ts reads it). */
  envOf(target: string): Record<string, string>;
  stop(): Promise<void>;
}

export async function benchDatabases(db: BenchDb, tmp: string): Promise<BenchDatabases> {
  if (db === 'sqlite') {
    return {
      db,
      create: async (name) => path.join(tmp, `${name}.sqlite`),
      envOf: (file) => ({ BENCH_DATABASE_FILE: file }),
      stop: async () => {},
    };
  }
  const cluster: PgCluster = await startCluster();
  return {
    db,
    create: async (name) => {
      await adminQuery(cluster.adminUrl, `CREATE DATABASE bench_${name}`);
      return cluster.urlOf(`bench_${name}`);
    },
    envOf: (url) => ({ BENCH_DATABASE_URL: url }),
    stop: () => cluster.stop(),
  };
}
