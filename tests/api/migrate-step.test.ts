// Migrations as their own step (`npm run db:migrate`): start-up migrates only when asked
// (MIGRATE_ON_START, on by default for the SQLite file), refuses a database behind the code with
// the step to run, and two processes migrating and seeding one empty database at once both finish
// with one café. Runs on SQLite and on the PostgreSQL leg alike.
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { Config } from '@server/config';
import { createDb } from '@server/db/knex';
import { DatabaseBehindError, migrateAndSeed } from '@server/db/migrate';
import { prepareDatabase } from '@server/server';
import { createEmptyDatabase } from '../support/test-database';

const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-migrate-'));
const drops: (() => Promise<void>)[] = [];
afterAll(async () => {
  for (const drop of drops) await drop();
  rmSync(dir, { recursive: true, force: true });
});

async function emptyDatabase() {
  const empty = await createEmptyDatabase(dir);
  drops.push(empty.drop);
  const pg = empty.target.startsWith('postgres');
  const config: Pick<Config, 'databaseFile' | 'databaseUrl' | 'seedDemo'> = {
    databaseFile: pg ? path.join(dir, `unused-${randomBytes(4).toString('hex')}.sqlite`) : empty.target,
    databaseUrl: pg ? empty.target : undefined,
    seedDemo: true,
  };
  return { ...empty, config };
}

describe('the migration step', () => {
  it('refuses to start on a database behind the code when start-up is not to migrate, naming the step', async () => {
    const { target, config } = await emptyDatabase();
    const refusal = await prepareDatabase({ ...config, migrateOnStart: false }, () => {}).catch((err: unknown) => err);
    expect(refusal).toBeInstanceOf(DatabaseBehindError);
    expect((refusal as Error).message).toContain('npm run db:migrate');
    const db = createDb(target);
    try {
      expect(await db.schema.hasTable('orders')).toBe(false); // nothing was migrated
    } finally {
      await db.destroy();
    }
  });

  it('starts without migrating once the step has run', async () => {
    const { target, config } = await emptyDatabase();
    const step = createDb(target);
    await migrateAndSeed(step, { seedDemo: true });
    await step.destroy();
    const db = await prepareDatabase({ ...config, migrateOnStart: false }, () => {});
    try {
      expect(Number((await db('cafe_groups').count({ n: '*' }).first())?.n)).toBe(1);
    } finally {
      await db.destroy();
    }
  });

  it('lets two processes migrate and seed one empty database at once: both finish, one café', async () => {
    const { target } = await emptyDatabase();
    const [a, b] = [createDb(target), createDb(target)];
    try {
      const results = await Promise.allSettled([migrateAndSeed(a, { seedDemo: true }), migrateAndSeed(b, { seedDemo: true })]);
      expect(results.map((r) => r.status)).toEqual(['fulfilled', 'fulfilled']);
      const seeded = results.map((r) => (r.status === 'fulfilled' ? r.value.seeded : null));
      expect(seeded.filter(Boolean)).toHaveLength(1);
      expect(Number((await a('cafe_groups').count({ n: '*' }).first())?.n)).toBe(1);
    } finally {
      await a.destroy();
      await b.destroy();
    }
  }, 120_000); // two whole migrations and seeds, one after the other: a net (over 60 s once at load 7)
});
