// The migration that makes sign-in names unique per group of cafés, on a real SQLite file: every
// person gets their café's group, every column and row is kept, a name may repeat in another group
// but not in the same one, and down gives back the table as it was.
import { describe, expect, it } from 'vitest';
import { migrationConfig } from '@server/db/knex';
import { migrationDatabases } from '../support/migration-db';

const MIGRATION = '20261203120000_usernames_per_group.ts';
const databaseBefore = migrationDatabases();

const person = (locationId: number, username: string) => ({
  location_id: locationId,
  username,
  name: `Person ${username}`,
  role: 'cashier',
  password_hash: 'x',
  created_at: '2026-01-01T00:00:00.000Z',
});

/** A database migrated up to, not including, this migration; two groups with a café each, a person in each, one with a session. */
async function beforeNamesPerGroup() {
  const db = await databaseBefore(MIGRATION);
  const cafes: { cafe: number; group: number }[] = [];
  for (const name of ['Tideline Espresso', 'Lanternfish Coffee']) {
    const [{ id: group }] = await db('cafe_groups').insert({ name, created_at: '2026-01-01T00:00:00.000Z' }).returning('id');
    const [{ id: cafe }] = await db('locations').insert({ name, created_at: '2026-01-01T00:00:00.000Z', group_id: group }).returning('id');
    cafes.push({ cafe, group });
  }
  const [{ id: sam }] = await db('users').insert(person(cafes[0].cafe, 'sam')).returning('id');
  await db('users').insert(person(cafes[1].cafe, 'ana'));
  // something that points at a person, so the rebuild must keep ids and links
  const [{ id: shift }] = await db('shifts')
    .insert({
      location_id: cafes[0].cafe,
      opened_at: '2026-01-01T08:00:00.000Z',
      opened_by: sam,
      opening_float_cents: 0,
      baristas_on_bar: 1,
      wait_target_seconds: 240,
    })
    .returning('id');
  const users = await db('users').orderBy('id').select('*');
  return { db, cafes, users, shift };
}

describe(`migration ${MIGRATION}`, () => {
  it('gives every person their café’s group and keeps every row, column and link', async () => {
    const { db, cafes, users, shift } = await beforeNamesPerGroup();
    await db.migrate.up(migrationConfig);
    const after = await db('users').orderBy('id').select('*');
    expect(after).toEqual(users.map((u, i) => ({ ...u, group_id: cafes[i].group })));
    expect(await db('shifts').where({ id: shift }).first('opened_by')).toEqual({ opened_by: users[0].id });
    expect(await db.raw('PRAGMA foreign_key_check')).toEqual([]);
  });

  it('lets another group use a name, and refuses it twice in one group', async () => {
    const { db, cafes } = await beforeNamesPerGroup();
    await db.migrate.up(migrationConfig);
    await db('users').insert({ ...person(cafes[1].cafe, 'sam'), group_id: cafes[1].group });
    await expect(db('users').insert({ ...person(cafes[0].cafe, 'sam'), group_id: cafes[0].group })).rejects.toThrow(/UNIQUE/);
    await expect(db('users').insert(person(cafes[0].cafe, 'new'))).rejects.toThrow(/NOT NULL/);
    await expect(db('users').insert({ ...person(cafes[0].cafe, 'lost'), group_id: 999 })).rejects.toThrow(/FOREIGN KEY/);
  });

  it('down gives back the table as it was, names unique everywhere', async () => {
    const { db, cafes, users } = await beforeNamesPerGroup();
    await db.migrate.up(migrationConfig);
    await db.migrate.down(migrationConfig);
    expect(await db('users').orderBy('id').select('*')).toEqual(users);
    const [{ sql }] = await db.raw("SELECT sql FROM sqlite_master WHERE name = 'users'");
    expect(sql).not.toContain('group_id');
    await expect(db('users').insert(person(cafes[1].cafe, 'sam'))).rejects.toThrow(/UNIQUE/);
    await db.migrate.up(migrationConfig);
    expect(await db('users').pluck('group_id')).toEqual([cafes[0].group, cafes[1].group]);
  });
});
