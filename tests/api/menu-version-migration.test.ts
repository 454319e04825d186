// The migration that gives each café a menu version (event_seqs.menu_version), on a real SQLite
// file: a café's existing sequence keeps its number and starts at version 0; down takes the column
// away and keeps the number; up again works.
import { describe, expect, it } from 'vitest';
import { migrationConfig } from '@server/db/knex';
import { migrationDatabases } from '../support/migration-db';

const MIGRATION = '20261203180000_menu_version.ts';
const databaseBefore = migrationDatabases();

async function withSequence() {
  const db = await databaseBefore(MIGRATION);
  const at = new Date().toISOString();
  const [{ id: group }] = await db('cafe_groups').insert({ name: 'Quayside Roasters', created_at: at }).returning('id');
  const [{ id: location }] = await db('locations').insert({ name: 'Quayside Roasters', created_at: at, group_id: group }).returning('id');
  await db('event_seqs').insert({ location_id: location, last_seq: 41 });
  return { db, location };
}

describe(`migration ${MIGRATION}`, () => {
  it('adds the version at 0 beside the number each café has', async () => {
    const { db, location } = await withSequence();
    await db.migrate.up(migrationConfig);
    expect(await db('event_seqs').where({ location_id: location }).first('last_seq', 'menu_version')).toEqual({ last_seq: 41, menu_version: 0 });
  });

  it('down takes it away and keeps the number; up again works', async () => {
    const { db, location } = await withSequence();
    await db.migrate.up(migrationConfig);
    await db('event_seqs').where({ location_id: location }).update({ menu_version: 3 });
    await db.migrate.down(migrationConfig);
    expect(await db('event_seqs').where({ location_id: location }).first()).toEqual({ location_id: location, last_seq: 41 });
    await db.migrate.up(migrationConfig);
    expect(await db('event_seqs').where({ location_id: location }).first('menu_version')).toEqual({ menu_version: 0 });
  });
});
