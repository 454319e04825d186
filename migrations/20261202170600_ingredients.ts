import type { Knex } from 'knex';

// Milks, menu items and extras record their ingredients; the allergens screens show are worked out
// from them for the café's list (src/domain/ingredients.ts), so the stored tags go.
//
// The data step fills ingredients from today's tags. A tag that names one ingredient becomes it
// ("soybeans" → soy); a tag that names a family becomes a stand-in the editor asks the owner to
// replace ("tree nuts" → "tree nuts (unspecified)"). Nothing is guessed from names: an oat milk
// without tags gets no ingredients, and Settings lists it as a milk to check.
//
// The table is a frozen copy of src/domain/ingredients.ts as of this migration: a migration must
// do tomorrow what it does today, whatever the app's module becomes.
const TAG_TO_INGREDIENT: Record<string, string> = {
  milk: 'milk (unspecified)',
  eggs: 'egg',
  fish: 'fish',
  'crustacean shellfish': 'crustaceans',
  crustaceans: 'crustaceans',
  'tree nuts': 'tree nuts (unspecified)',
  nuts: 'tree nuts (unspecified)',
  peanuts: 'peanut',
  wheat: 'wheat',
  'cereals containing gluten': 'gluten cereal (unspecified)',
  soybeans: 'soy',
  sesame: 'sesame',
  celery: 'celery',
  mustard: 'mustard',
  lupin: 'lupin',
  molluscs: 'molluscs',
  'sulphur dioxide and sulphites': 'sulphites',
};

/** [ingredient, US tag, EU tag], in the editor's order. */
const INGREDIENTS: [string, string | null, string | null][] = [
  ["cow's milk", 'milk', 'milk'],
  ["goat's milk", 'milk', 'milk'],
  ["sheep's milk", 'milk', 'milk'],
  ['milk (unspecified)', 'milk', 'milk'],
  ['egg', 'eggs', 'eggs'],
  ['wheat', 'wheat', 'cereals containing gluten'],
  ['rye', null, 'cereals containing gluten'],
  ['barley', null, 'cereals containing gluten'],
  ['oats', null, 'cereals containing gluten'],
  ['gluten cereal (unspecified)', 'wheat', 'cereals containing gluten'],
  ['rice', null, null],
  ['almond', 'tree nuts', 'nuts'],
  ['Brazil nut', 'tree nuts', 'nuts'],
  ['cashew', 'tree nuts', 'nuts'],
  ['hazelnut', 'tree nuts', 'nuts'],
  ['macadamia', 'tree nuts', 'nuts'],
  ['pecan', 'tree nuts', 'nuts'],
  ['pistachio', 'tree nuts', 'nuts'],
  ['walnut', 'tree nuts', 'nuts'],
  ['pine nut', 'tree nuts', null],
  ['tree nuts (unspecified)', 'tree nuts', 'nuts'],
  ['coconut', null, null],
  ['peanut', 'peanuts', 'peanuts'],
  ['soy', 'soybeans', 'soybeans'],
  ['sesame', 'sesame', 'sesame'],
  ['lupin', null, 'lupin'],
  ['mustard', null, 'mustard'],
  ['pea', null, null],
  ['fish', 'fish', 'fish'],
  ['crustaceans', 'crustacean shellfish', 'crustaceans'],
  ['molluscs', null, 'molluscs'],
  ['celery', null, 'celery'],
  ['sulphites', null, 'sulphur dioxide and sulphites'],
];
const ORDER = INGREDIENTS.map(([name]) => name);

const TABLES = ['milk_options', 'menu_items', 'modifiers'] as const;

const parse = (text: unknown): string[] => {
  try {
    const v = JSON.parse(String(text ?? '[]'));
    return Array.isArray(v) ? v.map(String) : [];
  } catch {
    return [];
  }
};

/** Each row with its café's list (menu items belong to a café through their category). */
async function rowsOf(knex: Knex, table: (typeof TABLES)[number], column: string) {
  const q =
    table === 'menu_items'
      ? knex('menu_items')
          .join('menu_categories', 'menu_categories.id', 'menu_items.category_id')
          .join('locations', 'locations.id', 'menu_categories.location_id')
      : knex(table).join('locations', 'locations.id', `${table}.location_id`);
  const rows: { id: number; value: string; list: 'US' | 'EU' }[] = await q.select(
    `${table}.id as id`,
    `${table}.${column} as value`,
    'locations.allergen_list as list',
  );
  return rows;
}

export async function up(knex: Knex): Promise<void> {
  for (const table of TABLES) {
    await knex.schema.alterTable(table, (t) => {
      t.json('ingredients').notNullable().defaultTo('[]');
    });
    for (const row of await rowsOf(knex, table, 'allergens')) {
      const found = parse(row.value).map((tag) => {
        const ingredient = TAG_TO_INGREDIENT[tag];
        // an allergen must never vanish quietly: a tag no list has stops the migration
        if (!ingredient) throw new Error(`${table} ${row.id}: allergen tag "${tag}" is on no published list; fix it, then migrate`);
        return ingredient;
      });
      const ingredients = ORDER.filter((name) => found.includes(name));
      await knex(table)
        .where({ id: row.id })
        .update({ ingredients: JSON.stringify(ingredients) });
    }
    // SQLite's own DROP COLUMN: Knex would rebuild the table, which past orders reference
    await knex.raw(`ALTER TABLE ${table} DROP COLUMN allergens`);
  }
}

/** Back to stored tags: each row's allergens under its café's list, worked out from its ingredients. */
export async function down(knex: Knex): Promise<void> {
  for (const table of TABLES) {
    await knex.schema.alterTable(table, (t) => {
      t.json('allergens').notNullable().defaultTo('[]');
    });
    for (const row of await rowsOf(knex, table, 'ingredients')) {
      const names = parse(row.value);
      const tags = INGREDIENTS.flatMap(([name, us, eu]) => {
        const tag = row.list === 'EU' ? eu : us;
        return names.includes(name) && tag ? [tag] : [];
      });
      await knex(table)
        .where({ id: row.id })
        .update({ allergens: JSON.stringify([...new Set(tags)]) });
    }
    await knex.raw(`ALTER TABLE ${table} DROP COLUMN ingredients`);
  }
}
