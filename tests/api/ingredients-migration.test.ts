// The migration that moves milks, items and extras from stored allergen tags to ingredients, on a
// real SQLite file: every tag becomes an ingredient that gives the same allergen back under the
// café's list, a tag no list has stops it, and down brings the tags back.
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Knex } from 'knex';
import { afterEach, describe, expect, it } from 'vitest';
import { createDb, migrationConfig } from '@server/db/knex';
import { allergensFrom } from '@/domain/ingredients';
import { jsonOf } from '../support/rows';

const MIGRATION = '20261202170600_ingredients.ts';
const open: { db: Knex; dir: string }[] = [];

afterEach(async () => {
  for (const { db, dir } of open.splice(0)) {
    await db.destroy();
    rmSync(dir, { recursive: true, force: true });
  }
});

/** A database migrated up to, not including, the ingredients migration. */
async function beforeIngredients(): Promise<Knex> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-migration-'));
  const db = createDb(path.join(dir, 'jugline.sqlite'));
  open.push({ db, dir });
  for (;;) {
    const [, pending] = (await db.migrate.list(migrationConfig)) as [unknown[], { file: string }[]];
    if (pending[0].file === MIGRATION) return db;
    await db.migrate.up(migrationConfig);
  }
}

/** A café on a list, with one milk, one item and one extra carrying the given tags. */
async function cafe(db: Knex, list: 'US' | 'EU', tags: { milk: string[]; item: string[]; extra: string[] }) {
  const [{ id: location }] = await db('locations')
    .insert({ name: `${list} café`, allergen_list: list, created_at: new Date().toISOString() })
    .returning('id');
  const [{ id: milk }] = await db('milk_options')
    .insert({ location_id: location, name: 'House', code: 'HO', allergens: JSON.stringify(tags.milk) })
    .returning('id');
  const [{ id: category }] = await db('menu_categories').insert({ location_id: location, name: 'Food' }).returning('id');
  const [{ id: item }] = await db('menu_items')
    .insert({ category_id: category, name: 'Pastry', station: 'counter', price_cents: 400, allergens: JSON.stringify(tags.item) })
    .returning('id');
  const [{ id: group }] = await db('modifier_groups').insert({ location_id: location, name: 'Syrup' }).returning('id');
  const [{ id: extra }] = await db('modifiers')
    .insert({ location_id: location, group_id: group, name: 'Nut syrup', allergens: JSON.stringify(tags.extra) })
    .returning('id');
  return { milk, item, extra };
}

const column = async (db: Knex, table: string, id: number, name: string) => jsonOf((await db(table).where({ id }).first(name))[name]) as string[];

// The tags are the published lists' names (FALCPA + FASTER Act; Regulation (EU) No 1169/2011 Annex II).
const US_TAGS = { milk: ['milk'], item: ['tree nuts', 'wheat', 'milk', 'eggs'], extra: ['peanuts', 'soybeans', 'sesame', 'fish', 'crustacean shellfish'] };
const EU_TAGS = {
  milk: ['cereals containing gluten'],
  item: ['nuts', 'celery', 'mustard', 'lupin', 'molluscs', 'crustaceans'],
  extra: ['sulphur dioxide and sulphites', 'milk'],
};

describe(`migration ${MIGRATION}`, () => {
  it('fills ingredients from the tags: one ingredient where a tag names one, a stand-in where it names a family', async () => {
    const db = await beforeIngredients();
    const us = await cafe(db, 'US', US_TAGS);
    const eu = await cafe(db, 'EU', EU_TAGS);
    const oat = await cafe(db, 'US', { milk: [], item: [], extra: [] });
    await db.migrate.up(migrationConfig);

    expect(await column(db, 'milk_options', us.milk, 'ingredients')).toEqual(['milk (unspecified)']);
    expect(await column(db, 'menu_items', us.item, 'ingredients')).toEqual(['milk (unspecified)', 'egg', 'wheat', 'tree nuts (unspecified)']);
    expect(await column(db, 'modifiers', us.extra, 'ingredients')).toEqual(['peanut', 'soy', 'sesame', 'fish', 'crustaceans']);
    expect(await column(db, 'milk_options', eu.milk, 'ingredients')).toEqual(['gluten cereal (unspecified)']);
    expect(await column(db, 'menu_items', eu.item, 'ingredients')).toEqual([
      'tree nuts (unspecified)',
      'lupin',
      'mustard',
      'crustaceans',
      'molluscs',
      'celery',
    ]);
    // nothing is guessed from a name: an untagged milk gets no ingredients
    expect(await column(db, 'milk_options', oat.milk, 'ingredients')).toEqual([]);

    // every allergen comes back under the café's own list: none is lost, none added
    for (const [list, ids, tags] of [
      ['US', us, US_TAGS],
      ['EU', eu, EU_TAGS],
    ] as const) {
      for (const [table, id, had] of [
        ['milk_options', ids.milk, tags.milk],
        ['menu_items', ids.item, tags.item],
        ['modifiers', ids.extra, tags.extra],
      ] as const) {
        expect(new Set(allergensFrom(await column(db, table, id, 'ingredients'), list)), `${list} ${table}`).toEqual(new Set(had));
      }
    }
    for (const table of ['milk_options', 'menu_items', 'modifiers']) expect(Object.keys(await db(table).columnInfo())).not.toContain('allergens');
  });

  it('a tag that is on no list stops the migration and leaves the tables as they were', async () => {
    const db = await beforeIngredients();
    const { milk } = await cafe(db, 'US', { milk: ['gluten'], item: [], extra: [] });
    await expect(db.migrate.up(migrationConfig)).rejects.toThrow(/"gluten" is on no published list/);
    expect(await column(db, 'milk_options', milk, 'allergens')).toEqual(['gluten']);
    expect(Object.keys(await db('milk_options').columnInfo())).not.toContain('ingredients');
  });

  it('down brings the tags back under each café’s list', async () => {
    const db = await beforeIngredients();
    const us = await cafe(db, 'US', US_TAGS);
    const eu = await cafe(db, 'EU', EU_TAGS);
    await db.migrate.up(migrationConfig);
    await db.migrate.down(migrationConfig);
    expect(new Set(await column(db, 'menu_items', us.item, 'allergens'))).toEqual(new Set(US_TAGS.item));
    expect(new Set(await column(db, 'modifiers', us.extra, 'allergens'))).toEqual(new Set(US_TAGS.extra));
    expect(new Set(await column(db, 'menu_items', eu.item, 'allergens'))).toEqual(new Set(EU_TAGS.item));
    expect(await column(db, 'milk_options', eu.milk, 'allergens')).toEqual(['cereals containing gluten']);
    expect(Object.keys(await db('menu_items').columnInfo())).not.toContain('ingredients');
  });
});
