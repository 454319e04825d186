// Published allergen lists a location chooses from. Never a home-made list.

/** US major food allergens: FALCPA 2004 (FD&C Act §201(qq)) plus sesame (FASTER Act 2021). */
export const US_ALLERGENS = ['milk', 'eggs', 'fish', 'crustacean shellfish', 'tree nuts', 'peanuts', 'wheat', 'soybeans', 'sesame'] as const;

/** EU Regulation (EU) No 1169/2011, Annex II. */
export const EU_ALLERGENS = [
  'cereals containing gluten',
  'crustaceans',
  'eggs',
  'fish',
  'peanuts',
  'soybeans',
  'milk',
  'nuts',
  'celery',
  'mustard',
  'sesame',
  'sulphur dioxide and sulphites',
  'lupin',
  'molluscs',
] as const;

export type AllergenList = 'US' | 'EU';

export function allergensOf(list: AllergenList): readonly string[] {
  return list === 'EU' ? EU_ALLERGENS : US_ALLERGENS;
}

/** The allergens a drink contains that the customer said they must avoid. */
export function allergyClash(contains: readonly string[], avoid: readonly string[]): string[] {
  return contains.filter((a) => avoid.includes(a));
}
