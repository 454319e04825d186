// Jug fixtures for the tests: a planned jug as the plan answers it, and random jug rules for the
// property tests: 1–4 pitchers (fill line ≤ capacity, minimum ≤ fill
// line), a waste allowance, a drinks-per-jug limit and a growth per texture. One big pitcher
// always holds any one test drink (≤ 300 ml of milk + ≤ 20 ml waste = 320 ml) grown by up to
// 100 %: its fill line is ≥ 320 ml and its capacity at least twice its fill line. It sits at a
// random place in the list: the plan must not depend on the order.
import fc from 'fast-check';
import type { Jug, JugRules, Pitcher } from '@/domain/jug-plan';

export const MAX_TEST_DRINK_ML = 300;

const pitcherArb = (fill: { min: number; max: number }, capacity: (fillLineMl: number, headroom: number) => number) =>
  fc
    .record({ fillLineMl: fc.integer(fill), headroom: fc.integer({ min: 0, max: 600 }), minPart: fc.double({ min: 0, max: 1, noNaN: true }) })
    .map(({ fillLineMl, headroom, minPart }): Pitcher => ({
      capacityMl: capacity(fillLineMl, headroom),
      fillLineMl,
      minFillMl: Math.floor(fillLineMl * minPart),
    }));

const anyPitcherArb = pitcherArb({ min: 40, max: 900 }, (fill, headroom) => fill + headroom);
const bigPitcherArb = pitcherArb({ min: 320, max: 900 }, (fill, headroom) => 2 * fill + headroom);

export const pitchersArb = fc.tuple(bigPitcherArb, fc.array(anyPitcherArb, { maxLength: 3 }), fc.nat()).map(([big, others, at]) => {
  const all = [...others];
  all.splice(at % (others.length + 1), 0, big);
  return all;
});

const pct = fc.integer({ min: 0, max: 100 });
export const rulesArb: fc.Arbitrary<JugRules> = fc.record({
  pitchers: pitchersArb,
  wasteMl: fc.integer({ min: 0, max: 20 }),
  maxDrinks: fc.integer({ min: 1, max: 8 }),
  expansionPct: fc.record({ flat: pct, silky: pct, foamy: pct }),
});

/** Oracle, written apart from src/domain/jug-plan.ts: does `p` hold `milkMl` of drinks steamed for `texture`? */
export function pitcherHolds(p: Pitcher, milkMl: number, texture: 'flat' | 'silky' | 'foamy', r: JugRules): boolean {
  const cold = Math.max(milkMl + r.wasteMl, p.minFillMl);
  return cold <= p.fillLineMl && cold * (100 + r.expansionPct[texture]) <= p.capacityMl * 100;
}

/** A jug the plan answers before anyone starts it. */
export const plannedJug = (pitcher: Pitcher, coldMl: number, wasteMl: number, steamFor: Jug['steamFor'], drinkIds: number[], fits = true): Jug => ({
  jugId: null,
  pitcher,
  coldMl,
  wasteMl,
  steamFor,
  fits,
  drinkIds,
});
