// The demo café goes only into an empty database, and a start on a database that has a café costs
// no password hashing: sixteen bcrypt hashes (a password and a PIN per demo sign-in, cost 10) took
// about two seconds of every restart before /readyz could answer. Counted through the real hasher.
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { DEMO_SIGN_INS, seedDemoCafeIfEmpty } from '@seeds/demo-cafe';
import { hashPassword } from '@server/auth/passwords';
import { createDb, migrate } from '@server/db/knex';
import { createEmptyDatabase } from '../support/test-database';

const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-demo-seed-'));
let db: Knex;
let drop: () => Promise<void>;

beforeAll(async () => {
  const empty = await createEmptyDatabase(dir);
  drop = empty.drop;
  db = createDb(empty.target);
  await migrate(db);
});
afterAll(async () => {
  await db.destroy();
  await drop();
  rmSync(dir, { recursive: true, force: true });
});

describe('the demo café at start-up', () => {
  it('is seeded into an empty database, and a later start hashes nothing and seeds nothing', async () => {
    let hashes = 0;
    const counted = (password: string, cost?: number) => (hashes++, hashPassword(password, cost));
    const first = await seedDemoCafeIfEmpty(db, new Date(), counted);
    expect(first).toEqual(expect.any(Number));
    expect(hashes).toBe(2 * DEMO_SIGN_INS.length);

    hashes = 0;
    expect(await seedDemoCafeIfEmpty(db, new Date(), counted)).toBeNull();
    expect(hashes).toBe(0);
    expect(Number((await db('locations').count<{ n: number }>({ n: '*' }).first())!.n)).toBe(2);
  });
});
