// The migration that puts cafés into groups, on a real SQLite file: every café already there goes
// into one group named after the first, nothing a café owns is lost, a new café needs a group, and
// down gives back the table as it was with every row.
import { describe, expect, it } from 'vitest';
import { migrationConfig } from '@server/db/knex';
import { migrationDatabases } from '../support/migration-db';

const MIGRATION = '20261203110000_cafe_groups.ts';
const databaseBefore = migrationDatabases();

/** A database migrated up to, not including, the groups; with two cafés, a person and a pitcher in each. */
async function beforeGroups() {
  const db = await databaseBefore(MIGRATION);
  const cafes: number[] = [];
  for (const [i, name] of ['Tideline Espresso', 'Lanternfish Coffee'].entries()) {
    const [{ id }] = await db('locations')
      .insert({ name, created_at: `2026-0${i + 1}-01T00:00:00.000Z`, tax_rate_milli_pct: 8250 + i, receipt_footer: `Thanks from ${name}` })
      .returning('id');
    cafes.push(id);
    await db('users').insert({
      location_id: id,
      username: `staff${i}`,
      name: `Staff ${i}`,
      role: 'cashier',
      password_hash: 'x',
      created_at: '2026-01-01T00:00:00.000Z',
    });
    await db('pitchers').insert({ location_id: id, capacity_ml: 600, fill_line_ml: 330 });
  }
  const locations = await db('locations').orderBy('id').select('*');
  return { db, cafes, locations };
}

describe(`migration ${MIGRATION}`, () => {
  it('puts every café into one group named after the first, keeping every column and what points at the cafés', async () => {
    const { db, cafes, locations } = await beforeGroups();
    await db.migrate.up(migrationConfig);
    const groups = await db('cafe_groups').select('id', 'name', 'created_at');
    expect(groups).toEqual([{ id: expect.any(Number), name: 'Tideline Espresso', created_at: '2026-01-01T00:00:00.000Z' }]);
    const after = await db('locations').orderBy('id').select('*');
    expect(after).toEqual(locations.map((l) => ({ ...l, group_id: groups[0].id })));
    expect(await db('users').orderBy('id').pluck('location_id')).toEqual(cafes);
    expect(await db('pitchers').orderBy('id').pluck('location_id')).toEqual(cafes);
    // a café needs a group that exists
    await expect(db('locations').insert({ name: 'No group', created_at: '2026-03-01T00:00:00.000Z' })).rejects.toThrow(/NOT NULL/);
    await expect(db('locations').insert({ name: 'Lost group', created_at: '2026-03-01T00:00:00.000Z', group_id: 999 })).rejects.toThrow(/FOREIGN KEY/);
  });

  it('on an empty database only adds the table and the column', async () => {
    const db = await databaseBefore(MIGRATION);
    await db.migrate.up(migrationConfig);
    expect(await db('cafe_groups').count({ n: '*' })).toEqual([{ n: 0 }]);
    expect(Object.keys(await db('locations').columnInfo())).toContain('group_id');
  });

  it('down gives back the cafés as they were and drops the groups', async () => {
    const { db, locations } = await beforeGroups();
    await db.migrate.up(migrationConfig);
    await db.migrate.down(migrationConfig);
    expect(await db('locations').orderBy('id').select('*')).toEqual(locations);
    expect(await db.schema.hasTable('cafe_groups')).toBe(false);
    const [{ sql }] = await db.raw("SELECT sql FROM sqlite_master WHERE name = 'locations'");
    expect(sql).not.toContain('group_id');
    await db.migrate.up(migrationConfig);
    expect(await db('locations').pluck('group_id')).toEqual([expect.any(Number), expect.any(Number)]);
  });
});
