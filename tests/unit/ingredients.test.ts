// Ingredients and the allergen each falls under on the two published lists, and what switching
// lists changes. Sources, as in docs/check-values.md ("Allergens"):
//   US: FALCPA 2004, FD&C Act §201(qq) (eight) + FASTER Act 2021 (sesame); FDA "Questions and
//       Answers Regarding Food Allergens" Edition 5, January 2025 (twelve tree nuts, no coconut;
//       milk includes goat's and sheep's milk).
//   EU: Regulation (EU) No 1169/2011, Annex II (fourteen).
import { describe, expect, it } from 'vitest';
import { allergenSwitch, type MenuEntry } from '@/domain/allergen-switch';
import { EU_ALLERGENS, US_ALLERGENS } from '@/domain/allergens';
import { allergenOf, allergensFrom, ingredientNamed, INGREDIENT_NAMES, INGREDIENTS, inOrder, unspecifiedOf, type Ingredient } from '@/domain/ingredients';

const both = (i: Ingredient) => [allergenOf(i, 'US'), allergenOf(i, 'EU')];

describe('the allergen each ingredient falls under', () => {
  it('oats: a cereal containing gluten on the EU list, no US major allergen', () => {
    expect(both('oats')).toEqual([null, 'cereals containing gluten']); // Annex II item 1; FALCPA names wheat only
    expect(both('rye')).toEqual([null, 'cereals containing gluten']); // Annex II item 1
    expect(both('barley')).toEqual([null, 'cereals containing gluten']); // Annex II item 1
    expect(both('wheat')).toEqual(['wheat', 'cereals containing gluten']); // §201(qq); Annex II item 1
  });

  it('almond and the other Annex II nuts: tree nuts and nuts', () => {
    // Annex II item 8 names almonds, hazelnuts, walnuts, cashews, pecans, Brazil nuts, pistachios,
    // macadamia; all eight are on the FDA's list of twelve tree nuts (Edition 5)
    for (const nut of ['almond', 'hazelnut', 'walnut', 'cashew', 'pecan', 'Brazil nut', 'pistachio', 'macadamia'] as const) {
      expect(both(nut), nut).toEqual(['tree nuts', 'nuts']);
    }
    // pine nut is one of the FDA's twelve but not among Annex II's eight
    expect(both('pine nut')).toEqual(['tree nuts', null]);
  });

  it('coconut: in neither list (FDA Edition 5, January 2025 removed it from the tree nuts; not in Annex II)', () => {
    expect(both('coconut')).toEqual([null, null]);
  });

  it('soy, milk, egg, peanut, sesame, fish, crustaceans: on both lists', () => {
    expect(both('soy')).toEqual(['soybeans', 'soybeans']); // §201(qq); Annex II item 6
    expect(both("cow's milk")).toEqual(['milk', 'milk']); // §201(qq); Annex II item 7
    expect(both("goat's milk")).toEqual(['milk', 'milk']); // FDA Edition 5: milk includes goat's milk; Annex II item 7
    expect(both("sheep's milk")).toEqual(['milk', 'milk']); // FDA Edition 5: and sheep's milk
    expect(both('egg')).toEqual(['eggs', 'eggs']); // §201(qq); Annex II item 3
    expect(both('peanut')).toEqual(['peanuts', 'peanuts']); // §201(qq); Annex II item 5
    expect(both('sesame')).toEqual(['sesame', 'sesame']); // FASTER Act 2021; Annex II item 11
    expect(both('fish')).toEqual(['fish', 'fish']); // §201(qq); Annex II item 4
    expect(both('crustaceans')).toEqual(['crustacean shellfish', 'crustaceans']); // §201(qq); Annex II item 2
  });

  it('celery, mustard, lupin, sulphites and molluscs: on the EU list only', () => {
    expect(both('celery')).toEqual([null, 'celery']); // Annex II item 9
    expect(both('mustard')).toEqual([null, 'mustard']); // Annex II item 10
    expect(both('sulphites')).toEqual([null, 'sulphur dioxide and sulphites']); // Annex II item 12
    expect(both('lupin')).toEqual([null, 'lupin']); // Annex II item 13
    expect(both('molluscs')).toEqual([null, 'molluscs']); // Annex II item 14; FALCPA names crustacean shellfish only
  });

  it('every allergen of both lists can be reached from some ingredient, and nothing off the lists', () => {
    // the nine of FALCPA + FASTER Act and the fourteen of Annex II
    expect(new Set(INGREDIENT_NAMES.map((i) => allergenOf(i, 'US')).filter(Boolean))).toEqual(new Set(US_ALLERGENS));
    expect(new Set(INGREDIENT_NAMES.map((i) => allergenOf(i, 'EU')).filter(Boolean))).toEqual(new Set(EU_ALLERGENS));
  });

  it('stand-ins for an old tag err safe: an unnamed gluten cereal counts as wheat on the US list (common practice: when unsure, warn)', () => {
    expect(both('gluten cereal (unspecified)')).toEqual(['wheat', 'cereals containing gluten']);
    expect(both('tree nuts (unspecified)')).toEqual(['tree nuts', 'nuts']);
    expect(unspecifiedOf(['oats', 'tree nuts (unspecified)', 'milk (unspecified)'])).toEqual(['milk (unspecified)', 'tree nuts (unspecified)']);
    expect(Object.values(INGREDIENTS).filter((f) => 'unspecified' in f)).toHaveLength(3);
  });
});

describe('allergensFrom', () => {
  it('gives each allergen once, in the list’s own order, and ignores a name it does not know', () => {
    const croissant = ['almond', 'wheat', "cow's milk", 'egg', 'hazelnut'];
    expect(allergensFrom(croissant, 'US')).toEqual(['milk', 'eggs', 'tree nuts', 'wheat']); // US_ALLERGENS order
    expect(allergensFrom(croissant, 'EU')).toEqual(['cereals containing gluten', 'eggs', 'milk', 'nuts']); // Annex II order
    expect(allergensFrom(['oats', 'not food'], 'US')).toEqual([]);
  });
});

describe('reading ingredient names', () => {
  it('ignores case, spaces and a typographic apostrophe; stores in the editor’s order', () => {
    expect(ingredientNamed('  Cow’s Milk ')).toBe("cow's milk");
    expect(ingredientNamed('brazil NUT')).toBe('Brazil nut');
    expect(ingredientNamed('oat')).toBeNull();
    expect(inOrder(['wheat', 'egg', 'wheat', 'oats'])).toEqual(['egg', 'wheat', 'oats']);
  });
});

describe('switching lists', () => {
  // the demo café's milks (seeds/demo-cafe.ts) and one of its pastries
  const demo: MenuEntry[] = [
    { kind: 'milk', id: 1, name: 'Whole', ingredients: ["cow's milk"] },
    { kind: 'milk', id: 3, name: 'Oat', ingredients: ['oats'] },
    { kind: 'milk', id: 5, name: 'Almond', ingredients: ['almond'] },
    { kind: 'milk', id: 6, name: 'Coconut', ingredients: ['coconut'] },
    { kind: 'item', id: 20, name: 'Almond croissant', ingredients: ["cow's milk", 'egg', 'wheat', 'almond'] },
  ];

  it('US → EU: oat milk gains cereals containing gluten, almond reads nuts; whole and coconut read the same', () => {
    const p = allergenSwitch(demo, 'US', 'EU');
    expect(p.changed.map((c) => [c.name, c.before, c.after])).toEqual([
      ['Oat', [], ['cereals containing gluten']], // Annex II item 1
      ['Almond', ['tree nuts'], ['nuts']], // §201(qq) tree nuts; Annex II item 8 nuts
      ['Almond croissant', ['milk', 'eggs', 'tree nuts', 'wheat'], ['cereals containing gluten', 'eggs', 'milk', 'nuts']],
    ]);
    expect(p.unchanged).toBe(2); // whole milk is milk on both; coconut is on neither
    expect(p.toCheck).toEqual([]);
  });

  it('EU → US: oat milk contains none, almond is still a tree nut, coconut none in both', () => {
    const p = allergenSwitch(demo, 'EU', 'US');
    const after = Object.fromEntries(p.changed.map((c) => [c.name, c.after]));
    expect(after.Oat).toEqual([]);
    expect(after.Almond).toEqual(['tree nuts']);
    expect(after.Coconut).toBeUndefined();
  });

  it('asks for a look at a stand-in ingredient and at a milk with none recorded', () => {
    const p = allergenSwitch(
      [
        { kind: 'milk', id: 1, name: 'Oat', ingredients: [] },
        { kind: 'item', id: 2, name: 'Nut slice', ingredients: ['tree nuts (unspecified)'] },
        { kind: 'item', id: 3, name: 'Espresso', ingredients: [] },
      ],
      'US',
      'EU',
    );
    expect(p.toCheck).toEqual([
      { kind: 'milk', id: 1, name: 'Oat', reason: 'no ingredients recorded: say what it is made of' },
      { kind: 'item', id: 2, name: 'Nut slice', reason: 'name the real ingredient for tree nuts (unspecified)' },
    ]);
  });
});
