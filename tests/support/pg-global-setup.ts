// Vitest globalSetup of the `server-pg` project: one throwaway cluster for the run, a template
// database migrated and seeded once (through `scripts/db.ts`, as `npm run db:seed` does), and the
// admin URL handed to the test workers, which clone one database per test server from the template.
import { spawnSync } from 'node:child_process';
import type { TestProject } from 'vitest/node';
import { adminQuery, startCluster } from '@scripts/services/postgres';

export const TEMPLATE_DATABASE = 'jugline_template';

declare module 'vitest' {
  export interface ProvidedContext {
    /** postgres://… of the maintenance database; only the `server-pg` project provides it. */
    pgAdminUrl: string;
  }
}

export default async function setup(project: TestProject) {
  const cluster = await startCluster();
  try {
    await adminQuery(cluster.adminUrl, `CREATE DATABASE ${TEMPLATE_DATABASE}`);
    // a child process: knex imports the .ts migrations with native import(), which needs tsx
    const seeded = spawnSync('node_modules/.bin/tsx', ['scripts/db.ts', 'seed'], {
      encoding: 'utf8',
      env: { ...process.env, DATABASE_URL: cluster.urlOf(TEMPLATE_DATABASE), NODE_ENV: 'test' },
    });
    if (seeded.status !== 0) throw new Error(`migrating and seeding the template failed:\n${seeded.stdout}\n${seeded.stderr}`);
  } catch (err) {
    await cluster.stop();
    throw err;
  }
  project.provide('pgAdminUrl', cluster.adminUrl);
  return () => cluster.stop();
}
