// The jug plan: which drinks of a milk lane to steam together, in which pitcher, with how much
// cold milk, poured in which order.
//
// Rules (common practice at a busy bar):
// - drinks are taken oldest first, and a batch never skips an older drink to take a newer one,
//   so batching never makes the oldest ticket wait;
// - a batch takes the smallest pitcher whose fill line holds its cold milk plus the waste
//   allowance; when even the largest can't, the batch closes and the next one starts;
// - the jug is steamed for the foamiest texture in it and poured thinnest first (flat, then
//   silky, then foamy), since the foam rises to the top as the jug empties;
// - iced drinks take cold milk straight from the fridge: no jug.
// Drinks already started stay in the plan: a jug being steamed stays "Jug 1" until it is bumped.
import type { Texture } from './types';

export interface Pitcher {
  capacityMl: number;
  fillLineMl: number;
}

export interface JugDrink {
  id: number;
  milkMl: number;
  texture: Texture | null;
}

export interface JugBatch {
  pitcher: Pitcher;
  /** Cold milk to pour into the pitcher, waste allowance included. */
  coldMl: number;
  /** Steam for this (the foamiest in the batch). */
  steamFor: Texture;
  /** Pour order: thinnest texture first; oldest first within a texture. */
  drinkIds: number[];
}

const THICKNESS: Record<Exclude<Texture, 'cold'>, number> = { flat: 0, silky: 1, foamy: 2 };

export const needsJug = (d: JugDrink) => d.texture !== null && d.texture !== 'cold' && d.milkMl > 0;

/** `drinks` must be in the lane's order (oldest first). `pitchers` in any order. */
export function planJugs(drinks: JugDrink[], pitchers: Pitcher[], wasteMl: number): JugBatch[] {
  const steamed = drinks.filter(needsJug);
  if (steamed.length === 0 || pitchers.length === 0) return [];
  const bySize = [...pitchers].sort((a, b) => a.fillLineMl - b.fillLineMl || a.capacityMl - b.capacityMl);
  const largest = bySize[bySize.length - 1];

  const batches: JugDrink[][] = [];
  let current: JugDrink[] = [];
  let milk = 0;
  for (const d of steamed) {
    if (current.length > 0 && milk + d.milkMl + wasteMl > largest.fillLineMl) {
      batches.push(current);
      current = [];
      milk = 0;
    }
    current.push(d);
    milk += d.milkMl;
  }
  batches.push(current);

  return batches.map((batch) => {
    const coldMl = batch.reduce((sum, d) => sum + d.milkMl, 0) + wasteMl;
    // a single drink bigger than every fill line still gets the largest pitcher
    const pitcher = bySize.find((p) => p.fillLineMl >= coldMl) ?? largest;
    const thick = (d: JugDrink) => THICKNESS[d.texture as keyof typeof THICKNESS];
    const pour = batch
      .map((d, age) => ({ d, age }))
      .sort((a, b) => thick(a.d) - thick(b.d) || a.age - b.age)
      .map(({ d }) => d);
    const foamiest = pour[pour.length - 1].texture as Texture;
    return { pitcher, coldMl, steamFor: foamiest, drinkIds: pour.map((d) => d.id) };
  });
}

/** "600 ml pitcher · pour 340 ml · 3 drinks · steam silky" */
export function describeBatch(b: JugBatch): string {
  const n = b.drinkIds.length;
  return `${b.pitcher.capacityMl} ml pitcher · pour ${b.coldMl} ml · ${n} drink${n === 1 ? '' : 's'} · steam ${b.steamFor}`;
}
