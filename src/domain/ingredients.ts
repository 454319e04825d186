// What a menu item, a milk or an extra contains, and the allergen each ingredient falls under in
// each published list. The owner records ingredients; the allergens every screen shows are worked
// out from them for the café's list, so switching lists needs no retagging and no guessing: oat
// milk is a "cereal containing gluten" under the EU list and no US major allergen.
//
// Sources (docs/check-values.md, "Allergens"): FALCPA 2004, FD&C Act §201(qq); FASTER Act 2021
// (sesame); FDA "Questions and Answers Regarding Food Allergens" Edition 5, January 2025 (tree nuts
// are twelve named nuts, coconut is no longer one; milk includes goat's and sheep's milk);
// Regulation (EU) No 1169/2011, Annex II.
import { allergensOf, type AllergenList, type EU_ALLERGENS, type US_ALLERGENS } from './allergens';

type UsAllergen = (typeof US_ALLERGENS)[number];
type EuAllergen = (typeof EU_ALLERGENS)[number];

export const INGREDIENT_GROUPS = ['Milk and egg', 'Cereals', 'Nuts', 'Beans and seeds', 'Fish and shellfish', 'Other'] as const;
export type IngredientGroup = (typeof INGREDIENT_GROUPS)[number];

interface IngredientFacts {
  group: IngredientGroup;
  /** The allergen it falls under on each list; null where the list names none. */
  US: UsAllergen | null;
  EU: EuAllergen | null;
  /** Set on the stand-ins for an old allergen tag that named no single ingredient. */
  unspecified?: true;
}

/** Every ingredient Jugline knows, in the order the editor shows them. */
export const INGREDIENTS = {
  "cow's milk": { group: 'Milk and egg', US: 'milk', EU: 'milk' },
  "goat's milk": { group: 'Milk and egg', US: 'milk', EU: 'milk' },
  "sheep's milk": { group: 'Milk and egg', US: 'milk', EU: 'milk' },
  'milk (unspecified)': { group: 'Milk and egg', US: 'milk', EU: 'milk', unspecified: true },
  egg: { group: 'Milk and egg', US: 'eggs', EU: 'eggs' },
  // Annex II item 1 names wheat, rye, barley and oats; FALCPA names wheat alone.
  wheat: { group: 'Cereals', US: 'wheat', EU: 'cereals containing gluten' },
  rye: { group: 'Cereals', US: null, EU: 'cereals containing gluten' },
  barley: { group: 'Cereals', US: null, EU: 'cereals containing gluten' },
  oats: { group: 'Cereals', US: null, EU: 'cereals containing gluten' },
  // an old EU tag may have meant wheat: it counts as wheat on the US list, erring safe
  'gluten cereal (unspecified)': { group: 'Cereals', US: 'wheat', EU: 'cereals containing gluten', unspecified: true },
  rice: { group: 'Cereals', US: null, EU: null },
  // Annex II item 8 names eight nuts; the FDA's twelve tree nuts include them and pine nut.
  almond: { group: 'Nuts', US: 'tree nuts', EU: 'nuts' },
  'Brazil nut': { group: 'Nuts', US: 'tree nuts', EU: 'nuts' },
  cashew: { group: 'Nuts', US: 'tree nuts', EU: 'nuts' },
  hazelnut: { group: 'Nuts', US: 'tree nuts', EU: 'nuts' },
  macadamia: { group: 'Nuts', US: 'tree nuts', EU: 'nuts' },
  pecan: { group: 'Nuts', US: 'tree nuts', EU: 'nuts' },
  pistachio: { group: 'Nuts', US: 'tree nuts', EU: 'nuts' },
  walnut: { group: 'Nuts', US: 'tree nuts', EU: 'nuts' },
  'pine nut': { group: 'Nuts', US: 'tree nuts', EU: null },
  'tree nuts (unspecified)': { group: 'Nuts', US: 'tree nuts', EU: 'nuts', unspecified: true },
  coconut: { group: 'Nuts', US: null, EU: null },
  peanut: { group: 'Beans and seeds', US: 'peanuts', EU: 'peanuts' },
  soy: { group: 'Beans and seeds', US: 'soybeans', EU: 'soybeans' },
  sesame: { group: 'Beans and seeds', US: 'sesame', EU: 'sesame' },
  lupin: { group: 'Beans and seeds', US: null, EU: 'lupin' },
  mustard: { group: 'Beans and seeds', US: null, EU: 'mustard' },
  pea: { group: 'Beans and seeds', US: null, EU: null },
  fish: { group: 'Fish and shellfish', US: 'fish', EU: 'fish' },
  crustaceans: { group: 'Fish and shellfish', US: 'crustacean shellfish', EU: 'crustaceans' },
  molluscs: { group: 'Fish and shellfish', US: null, EU: 'molluscs' },
  celery: { group: 'Other', US: null, EU: 'celery' },
  // Annex II item 12: above 10 mg/kg or 10 mg/L as SO₂
  sulphites: { group: 'Other', US: null, EU: 'sulphur dioxide and sulphites' },
} as const satisfies Record<string, IngredientFacts>;

export type Ingredient = keyof typeof INGREDIENTS;
export const INGREDIENT_NAMES = Object.keys(INGREDIENTS) as [Ingredient, ...Ingredient[]];

const FACTS: Record<string, IngredientFacts | undefined> = INGREDIENTS;

export const isIngredient = (name: string): name is Ingredient => FACTS[name] !== undefined;

/** "Cow’s Milk" or "oats " as an owner may type it → the ingredient, or null. */
export function ingredientNamed(text: string): Ingredient | null {
  const key = text
    .trim()
    .replace(/[\u2018\u2019]/g, "'")
    .toLowerCase();
  return INGREDIENT_NAMES.find((n) => n.toLowerCase() === key) ?? null;
}

/** The allergen an ingredient falls under on a list, or null. */
export const allergenOf = (ingredient: Ingredient, list: AllergenList): string | null => INGREDIENTS[ingredient][list];

/** The allergens some ingredients contain under a list, once each, in the list's own order. */
export function allergensFrom(ingredients: readonly string[], list: AllergenList): string[] {
  const found = new Set(ingredients.flatMap((i) => (isIngredient(i) && allergenOf(i, list) ? [allergenOf(i, list)!] : [])));
  return allergensOf(list).filter((a) => found.has(a));
}

/** Known ingredients once each in the editor's order; what a row stores. */
export const inOrder = (ingredients: readonly string[]): Ingredient[] => INGREDIENT_NAMES.filter((n) => ingredients.includes(n));

/** Stand-ins for an old tag ("tree nuts (unspecified)"): the owner should name the real one. */
export const unspecifiedOf = (ingredients: readonly string[]): Ingredient[] => inOrder(ingredients).filter((i) => (FACTS[i] as IngredientFacts).unspecified);

/** The ingredients of one group, for the editor's picker. */
export const ingredientsIn = (group: IngredientGroup): Ingredient[] => INGREDIENT_NAMES.filter((n) => INGREDIENTS[n].group === group);

/** Shown wherever allergens are: the list says what a recipe contains, not what a shared jug touched. */
export const ALLERGEN_CAUTION =
  'Allergens are worked out from the ingredients recorded here. Cross-contact on a shared steam wand or jug is possible. Check suppliers’ labels, and follow local law and the café’s own allergen procedure.';
