// Which card each bump key (1–9) bumps. A key goes only to a card on screen, and a card keeps its
// key for as long as it stays on screen: bumping card 3 takes key 3 off the screen with it and
// leaves every other card's number as the barista read it. A card coming into view takes the
// lowest free key, cards in screen order (lane by lane, oldest first).

export const BUMP_KEYS = 9;

/** `visible`: ids of the cards on screen, in screen order. Returns id → key for those given one. */
export function assignBumpKeys(previous: ReadonlyMap<number, number>, visible: readonly number[]): Map<number, number> {
  const next = new Map<number, number>();
  for (const id of visible) {
    const key = previous.get(id);
    if (key !== undefined) next.set(id, key);
  }
  const taken = new Set(next.values());
  let key = 1;
  for (const id of visible) {
    if (next.has(id)) continue;
    while (taken.has(key)) key++;
    if (key > BUMP_KEYS) break;
    next.set(id, key);
    taken.add(key);
  }
  return next;
}
