// An item form sends its whole list of sizes, in order. Against the sizes the item has, that list
// says which to update (and bring back if retired), which to add and which to retire — never
// delete, because past orders point at their size.

export interface StoredSize {
  id: number;
  retired: boolean;
}

export interface SizeChanges {
  /** Listed ids the item doesn't have (another item's or another café's): refuse as not found. */
  unknown: number[];
  /** Listed sizes that exist, with their new place; `restore` when it was retired. */
  keep: { id: number; sort: number; restore: boolean }[];
  /** Places in the list of the new sizes (no id). */
  insert: number[];
  /** Sizes in use now that the list leaves out. */
  retire: number[];
}

export function planSizeChanges(stored: readonly StoredSize[], listed: readonly { id?: number }[]): SizeChanges {
  const byId = new Map(stored.map((s) => [s.id, s]));
  const listedIds = new Set(listed.flatMap((s) => (s.id === undefined ? [] : [s.id])));
  const changes: SizeChanges = { unknown: [], keep: [], insert: [], retire: [] };
  listed.forEach((s, sort) => {
    if (s.id === undefined) changes.insert.push(sort);
    else if (!byId.has(s.id)) changes.unknown.push(s.id);
    else changes.keep.push({ id: s.id, sort, restore: byId.get(s.id)!.retired });
  });
  changes.retire = stored.filter((s) => !s.retired && !listedIds.has(s.id)).map((s) => s.id);
  return changes;
}
