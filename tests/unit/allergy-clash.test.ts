// A drink that contains what the customer must avoid is caught before it is sent.
import { describe, expect, it } from 'vitest';
import { allergyClash, US_ALLERGENS } from '@/domain/allergens';

describe('allergyClash', () => {
  it('names each allergen the drink contains that the customer avoids', () => {
    // Almond milk is a tree nut under both the US (FDA, FALCPA) and EU (1169/2011 Annex II) lists
    expect(allergyClash(['tree nuts'], ['tree nuts', 'sesame'])).toEqual(['tree nuts']);
    expect(allergyClash(['milk', 'soybeans'], ['soybeans', 'milk'])).toEqual(['milk', 'soybeans']);
  });
  it('is empty when nothing matches', () => {
    // coconut is not a tree nut since FDA guidance of January 2025 (check-values.md): no clash
    expect(allergyClash([], ['tree nuts'])).toEqual([]);
    expect(allergyClash(['milk'], [])).toEqual([]);
  });
  it('uses the nine US major allergens (FALCPA 2004 + FASTER Act 2021)', () => {
    expect(US_ALLERGENS).toHaveLength(9);
    expect(US_ALLERGENS).toContain('sesame');
  });
});
