// What switching the café's allergen list changes, for the owner to read before confirming: per
// milk, item and extra, its allergens under the current list and under the new one, both worked
// out from its ingredients (src/domain/ingredients.ts). Nothing is retagged; nothing is guessed.
import type { AllergenList } from './allergens';
import { allergensFrom, unspecifiedOf } from './ingredients';

export type MenuEntryKind = 'milk' | 'item' | 'extra';

export interface MenuEntry {
  kind: MenuEntryKind;
  id: number;
  name: string;
  ingredients: string[];
}

export interface SwitchChange extends MenuEntry {
  before: string[];
  after: string[];
}

export interface SwitchCheck {
  kind: MenuEntryKind;
  id: number;
  name: string;
  reason: string;
}

export interface AllergenSwitchPreview {
  from: AllergenList;
  to: AllergenList;
  /** Entries whose allergens read differently under the new list. */
  changed: SwitchChange[];
  /** How many entries read the same under both. */
  unchanged: number;
  /** Entries whose ingredients don't say enough: a stand-in for an old tag, or a milk with none. */
  toCheck: SwitchCheck[];
}

const same = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((x, i) => x === b[i]);

export function allergenSwitch(entries: readonly MenuEntry[], from: AllergenList, to: AllergenList): AllergenSwitchPreview {
  const changed: SwitchChange[] = [];
  const toCheck: SwitchCheck[] = [];
  for (const e of entries) {
    const before = allergensFrom(e.ingredients, from);
    const after = allergensFrom(e.ingredients, to);
    if (!same(before, after)) changed.push({ ...e, before, after });
    const vague = unspecifiedOf(e.ingredients);
    if (vague.length > 0) toCheck.push({ kind: e.kind, id: e.id, name: e.name, reason: `name the real ingredient for ${vague.join(', ')}` });
    else if (e.kind === 'milk' && e.ingredients.length === 0)
      toCheck.push({ kind: e.kind, id: e.id, name: e.name, reason: 'no ingredients recorded: say what it is made of' });
  }
  return { from, to, changed, unchanged: entries.length - changed.length, toCheck };
}
