// How the Pickup wall shares its columns between "Being made" and "Ready". Every name is either
// shown whole or counted in a "+n more" line: a half never cuts a name in two or hides one unsaid.
// A half that needs little room (an empty "Ready" at the start of a rush) keeps one column for its
// heading and leaves the rest to the other half.

export interface PickupSpace {
  /** Name columns across the whole wall (2 or more). */
  columns: number;
  /** Name rows that fit under a half's heading. */
  rows: number;
}

export interface HalfLayout {
  columns: number;
  /** How many names to show, in the half's order. */
  shown: number;
  /** How many more there are: shown in place of the last name as "+n more". */
  more: number;
}

const need = (names: number, rows: number) => Math.max(1, Math.ceil(names / rows));

function fill(names: number, columns: number, rows: number): HalfLayout {
  const capacity = columns * rows;
  // the "+n more" line takes the last place, so it never needs a row of its own
  if (names <= capacity) return { columns, shown: names, more: 0 };
  const shown = Math.max(0, capacity - 1);
  return { columns, shown, more: names - shown };
}

export function pickupLayout(making: number, ready: number, space: PickupSpace): { making: HalfLayout; ready: HalfLayout } {
  const rows = Math.max(1, Math.floor(space.rows));
  const total = Math.max(2, Math.floor(space.columns));
  let m = 1;
  let r = 1;
  // one column at a time to the half that is shorter of room; the rest to the half with more names
  for (let spare = total - 2; spare > 0; spare--) {
    const mShort = need(making, rows) - m;
    const rShort = need(ready, rows) - r;
    if (mShort <= 0 && rShort <= 0) {
      if (making >= ready) m++;
      else r++;
    } else if (mShort >= rShort) m++;
    else r++;
  }
  return { making: fill(making, m, rows), ready: fill(ready, r, rows) };
}
