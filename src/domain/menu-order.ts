// Moving one row up or down among its siblings (categories, items of a category, milks…).

export type Direction = 'up' | 'down';

/** The ids in their new order after moving `id` one place; null when it can't move that way. */
export function moveAmong(ids: readonly number[], id: number, direction: Direction): number[] | null {
  const from = ids.indexOf(id);
  if (from < 0) return null;
  const to = direction === 'up' ? from - 1 : from + 1;
  if (to < 0 || to >= ids.length) return null;
  const next = [...ids];
  [next[from], next[to]] = [next[to], next[from]];
  return next;
}
