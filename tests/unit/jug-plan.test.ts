import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { describeJug, makeJug, needsJug, planJugs, type Jug, type JugDrink, type JugRules, type Pitcher } from '@/domain/jug-plan';
import type { Texture } from '@/domain/types';
import { MAX_TEST_DRINK_ML, pitcherHolds, plannedJug, rulesArb } from '../support/jugs';

// Invented pitchers for these tests (not the demo café's). Each has:
// - a fill line below the capacity: common practice is to fill a milk pitcher with cold milk to
//   just below the base of the spout (docs/check-values.md, "Espresso and beans");
// - a minimum fill of about a third of the capacity, rounded up to 10 ml, so the steam tip stays
//   under the milk (common practice, from memory; no published source);
// The numbers themselves are invented.
const SMALL: Pitcher = { capacityMl: 300, fillLineMl: 160, minFillMl: 100 };
const MEDIUM: Pitcher = { capacityMl: 500, fillLineMl: 280, minFillMl: 170 };
const LARGE: Pitcher = { capacityMl: 1000, fillLineMl: 560, minFillMl: 340 };
// Growth of the milk when steamed, in percent of the cold milk: flat about 10–20 %, silky
// 20–30 %, foamy 50–100 % (common practice, from memory; no published source). We take the
// middle of each range, as the café's defaults do.
const EXPANSION = { flat: 15, silky: 25, foamy: 75 };
const RULES: JugRules = {
  // Deliberately out of size order: the plan takes pitchers in any order.
  pitchers: [LARGE, SMALL, MEDIUM],
  wasteMl: 20,
  // Two to four cups from one jug (common practice, from memory).
  maxDrinks: 4,
  expansionPct: EXPANSION,
};
const rules = (o: Partial<JugRules> = {}): JugRules => ({ ...RULES, ...o });

let nextId = 1;
function d(milkMl: number, texture: Texture | null = 'flat'): JugDrink {
  return { id: nextId++, milkMl, texture };
}
const jug = plannedJug;

describe('needsJug', () => {
  it('is true only for a steamed texture with some milk', () => {
    // Common practice: only steamed milk goes in a jug.
    expect(needsJug({ id: 1, milkMl: 150, texture: 'flat' })).toBe(true);
    expect(needsJug({ id: 1, milkMl: 150, texture: 'silky' })).toBe(true);
    expect(needsJug({ id: 1, milkMl: 150, texture: 'foamy' })).toBe(true);
    // Iced drinks take cold milk straight from the fridge (common practice).
    expect(needsJug({ id: 1, milkMl: 150, texture: 'cold' })).toBe(false);
    expect(needsJug({ id: 1, milkMl: 0, texture: 'flat' })).toBe(false);
    expect(needsJug({ id: 1, milkMl: 150, texture: null })).toBe(false);
  });
});

describe('planJugs (hand-worked)', () => {
  it('puts one drink alone in the smallest pitcher that holds it', () => {
    // Hand-worked from the rules above (cold milk ≤ fill line, common practice; cold milk ×
    // growth ≤ capacity, common practice; at least the minimum fill, from memory).
    // 150 ml + 20 ml waste = 170 ml: > 160 (300 ml pitcher's fill line); ≤ 280 (500 ml), ≥ its
    // minimum 170, and 170 × 1.15 = 195.5 ≤ 500 → 500 ml pitcher.
    const fw = d(150, 'flat');
    expect(planJugs([fw], RULES)).toEqual([jug(MEDIUM, 170, 20, 'flat', [fw.id])]);

    // 120 + 20 = 140 ≤ 160, ≥ 100, 140 × 1.25 = 175 ≤ 300 → 300 ml pitcher.
    const cortado = d(120, 'silky');
    expect(planJugs([cortado], RULES)).toEqual([jug(SMALL, 140, 20, 'silky', [cortado.id])]);

    // Exactly on the fill line still fits: 140 + 20 = 160 ≤ 160 → 300 ml pitcher.
    expect(planJugs([d(140, 'flat')], RULES)[0].pitcher).toEqual(SMALL);
    // One more ml does not: 161 > 160 → the 500 ml pitcher, filled to its minimum 170 ml
    // (9 ml more than the drink needs, shown as waste: 170 − 141 = 29 ml).
    const over = d(141, 'flat');
    expect(planJugs([over], RULES)).toEqual([jug(MEDIUM, 170, 29, 'flat', [over.id])]);
  });

  it('fills a jug whose drinks need less than the minimum up to the minimum, and shows the extra as waste', () => {
    // A macchiato's 30 ml foamy milk + 20 ml waste = 50 ml: too little to cover the steam tip.
    // The 300 ml pitcher's minimum is 100 ml (a third of it, from memory) → pour 100 ml;
    // 100 × 1.75 = 175 ≤ 300. Waste: 100 − 30 = 70 ml.
    const macchiato = d(30, 'foamy');
    const [batch] = planJugs([macchiato], RULES);
    expect(batch).toEqual(jug(SMALL, 100, 70, 'foamy', [macchiato.id]));
    expect(describeJug(batch)).toBe('300 ml pitcher · fill to 100 ml (70 ml waste) · 1 drink · long stretch (dry)');
  });

  it('steams three drinks that fit together as one jug in the smallest pitcher that holds the sum', () => {
    // 60 + 80 + 100 = 240 ml, + 20 waste = 260 ml: > 160; ≤ 280, 260 × 1.15 = 299 ≤ 500 → one jug
    // in the 500 ml pitcher. All flat → pour in lane order (oldest first, common practice).
    const a = d(60);
    const b = d(80);
    const c = d(100);
    expect(planJugs([a, b, c], RULES)).toEqual([jug(MEDIUM, 260, 20, 'flat', [a.id, b.id, c.id])]);
  });

  it('fills the largest pitcher exactly to its fill line without closing the jug', () => {
    // 200 + 300 + 40 = 540, + 20 = 560 = 560 (1000 ml fill line); 560 × 1.15 = 644 ≤ 1000.
    const a = d(200);
    const b = d(300);
    const c = d(40);
    expect(planJugs([a, b, c], RULES)).toEqual([jug(LARGE, 560, 20, 'flat', [a.id, b.id, c.id])]);
  });

  it('closes the jug at an older drink that does not fit, rather than skipping it for a newer small one', () => {
    // Lane order (oldest first): 200, 300, 60, 30; waste 20; largest fill line 560.
    // Jug 1: 200 + 300 + 20 = 520 ≤ 560 (1000 ml). Adding 60 → 580 > 560, so the jug closes here.
    //   The 30 ml drink would still fit (550) but taking it would skip the older 60 ml drink —
    //   never done: common practice is that batching never makes an older ticket wait.
    // Jug 2: 60 + 30 + 20 = 110 ≤ 160, ≥ 100 → 300 ml pitcher.
    const a = d(200);
    const b = d(300);
    const c = d(60);
    const e = d(30);
    expect(planJugs([a, b, c, e], RULES)).toEqual([jug(LARGE, 520, 20, 'flat', [a.id, b.id]), jug(SMALL, 110, 20, 'flat', [c.id, e.id])]);
  });

  it('splits drinks too much for the biggest pitcher into two jugs, each in the right pitcher', () => {
    // Four 150 ml drinks, waste 20.
    // Jug 1: 150 × 3 + 20 = 470 ≤ 560; a fourth → 620 > 560, close. 470 > 280 → 1000 ml pitcher.
    // Jug 2: 150 + 20 = 170 > 160; ≤ 280 and = the 500 ml pitcher's minimum → 500 ml pitcher.
    const ds = [d(150), d(150), d(150), d(150)];
    expect(planJugs(ds, RULES)).toEqual([jug(LARGE, 470, 20, 'flat', [ds[0].id, ds[1].id, ds[2].id]), jug(MEDIUM, 170, 20, 'flat', [ds[3].id])]);
  });

  it('puts no more drinks in a jug than the café allows', () => {
    // Twelve 40 ml drinks (the reported rush). With at most 4 a jug (from memory: two to four cups
    // from one jug), three jugs of 4 × 40 + 20 = 180 ml: > 160; ≤ 280, ≥ 170, 180 × 1.15 = 207 ≤ 500
    // → the 500 ml pitcher, three times.
    const ds = Array.from({ length: 12 }, () => d(40));
    const ids = ds.map((x) => x.id);
    expect(planJugs(ds, RULES)).toEqual([
      jug(MEDIUM, 180, 20, 'flat', ids.slice(0, 4)),
      jug(MEDIUM, 180, 20, 'flat', ids.slice(4, 8)),
      jug(MEDIUM, 180, 20, 'flat', ids.slice(8, 12)),
    ]);
    // The limit is what splits them: allowing 12, all 12 fit one 1000 ml pitcher
    // (12 × 40 + 20 = 500 ≤ 560, ≥ 340, 500 × 1.15 = 575 ≤ 1000).
    expect(planJugs(ds, rules({ maxDrinks: 12 }))).toEqual([jug(LARGE, 500, 20, 'flat', ids)]);
  });

  it('leaves room for the milk to grow by its texture: a pitcher filled to the brim holds a flat jug but not a foamy one', () => {
    // A pitcher whose fill line is its capacity (400 ml, minimum 140). 230 ml + 20 = 250 ml cold.
    // Flat grows about 15 % (common practice, from memory): 250 × 1.15 = 287.5 ≤ 400 → it fits.
    // Foamy grows about 75 %: 250 × 1.75 = 437.5 > 400 → it would overflow; the 1000 ml pitcher
    // takes it, filled to its minimum 340 ml (340 × 1.75 = 595 ≤ 1000); waste 340 − 230 = 110.
    const brim: Pitcher = { capacityMl: 400, fillLineMl: 400, minFillMl: 140 };
    const r = rules({ pitchers: [brim, LARGE] });
    const flat = d(230, 'flat');
    const foamy = d(230, 'foamy');
    expect(planJugs([flat], r)).toEqual([jug(brim, 250, 20, 'flat', [flat.id])]);
    expect(planJugs([foamy], r)).toEqual([jug(LARGE, 340, 110, 'foamy', [foamy.id])]);
  });

  it('takes the growth up to the brim exactly, and not a millilitre over', () => {
    // Only a 350 ml pitcher filled to the brim. Foamy 180 + 20 = 200 ml; 200 × 1.75 = 350 = 350.
    const brim: Pitcher = { capacityMl: 350, fillLineMl: 350, minFillMl: 120 };
    const r = rules({ pitchers: [brim] });
    const fits = d(180, 'foamy');
    expect(planJugs([fits], r)).toEqual([jug(brim, 200, 20, 'foamy', [fits.id])]);
    // 181 + 20 = 201; 201 × 1.75 = 351.75 > 350: no pitcher holds it. Alone, it still gets the
    // largest pitcher, marked as not fitting.
    const over = d(181, 'foamy');
    expect(planJugs([over], r)).toEqual([jug(brim, 201, 20, 'foamy', [over.id], false)]);
  });

  it('closes a flat jug when a foamy drink would make it overflow, though its cold milk is under the fill line', () => {
    // One pitcher, 500 ml with a high fill line of 450 and a minimum of 100.
    // Flat 200 + flat 150 + 20 = 370 ≤ 450; 370 × 1.15 = 425.5 ≤ 500 → together.
    // A foamy 20 ml drink: 390 ≤ 450, but the jug is then steamed foamy: 390 × 1.75 = 682.5 > 500.
    // So it starts jug 2: 20 + 20 = 40, filled to the minimum 100; 100 × 1.75 = 175 ≤ 500.
    const tall: Pitcher = { capacityMl: 500, fillLineMl: 450, minFillMl: 100 };
    const r = rules({ pitchers: [tall] });
    const a = d(200, 'flat');
    const b = d(150, 'flat');
    const c = d(20, 'foamy');
    expect(planJugs([a, b, c], r)).toEqual([jug(tall, 370, 20, 'flat', [a.id, b.id]), jug(tall, 100, 80, 'foamy', [c.id])]);
  });

  it('steams mixed textures for the foamiest and pours thinnest first, oldest first within a texture', () => {
    // Common practice: steam for the foamiest drink in the jug and pour thinnest first, since the
    // foam rises to the top as the jug empties.
    // Lane order: A foamy 80, B flat 60, C silky 50, D flat 40.
    // 80 + 60 + 50 + 40 = 230, + 20 = 250: > 160; ≤ 280, ≥ 170, 250 × 1.75 = 437.5 ≤ 500 → 500 ml.
    // Steam for foamy (A). Pour order: flat B, flat D (B older), silky C, foamy A.
    const A = d(80, 'foamy');
    const B = d(60, 'flat');
    const C = d(50, 'silky');
    const D = d(40, 'flat');
    expect(planJugs([A, B, C, D], RULES)).toEqual([jug(MEDIUM, 250, 20, 'foamy', [B.id, D.id, C.id, A.id])]);

    // No foamy drink: silky wins. Lane: silky 70, flat 50 → 70 + 50 + 20 = 140 ≤ 160, ≥ 100,
    // 140 × 1.25 = 175 ≤ 300 → 300 ml. Pour: flat first, then silky.
    const S = d(70, 'silky');
    const F = d(50, 'flat');
    expect(planJugs([S, F], RULES)).toEqual([jug(SMALL, 140, 20, 'silky', [F.id, S.id])]);
  });

  it('gives iced drinks and drinks without milk no jug and leaves them out of every jug', () => {
    // Common practice: iced drinks take cold milk from the fridge.
    // Lane: iced latte 200 (cold), 0 ml flat, untextured 150, flat 100.
    // Only the flat 100 needs a jug: 100 + 20 = 120 ≤ 160, ≥ 100 → 300 ml pitcher.
    const iced = d(200, 'cold');
    const noMilk = d(0, 'flat');
    const untextured = d(150, null);
    const fw = d(100, 'flat');
    expect(planJugs([iced, noMilk, untextured, fw], RULES)).toEqual([jug(SMALL, 120, 20, 'flat', [fw.id])]);
    // A lane of only such drinks has no jug plan.
    expect(planJugs([iced, noMilk, untextured], RULES)).toEqual([]);
    expect(planJugs([], RULES)).toEqual([]);
  });

  it('plans nothing when the location has no pitchers', () => {
    // Jugline's own rule (no outside value): no pitcher, no plan (Settings keeps at least one).
    expect(planJugs([d(150), d(100)], rules({ pitchers: [] }))).toEqual([]);
  });

  it('gives a single drink bigger than every fill line the largest pitcher, alone, marked as not fitting', () => {
    // 600 + 20 = 620 > 560 (largest fill line) → 1000 ml pitcher, by itself, fits: false.
    const huge = d(600);
    const [alone] = planJugs([huge], RULES);
    expect(alone).toEqual(jug(LARGE, 620, 20, 'flat', [huge.id], false));
    expect(describeJug(alone)).toBe(
      '1000 ml pitcher · fill to 620 ml (20 ml waste) · 1 drink · short stretch (wet) · too much for one pitcher: steam it in two goes',
    );

    // Between two small drinks it is still alone:
    // Jug 1: 100 + 20 = 120 ≤ 160, ≥ 100 → 300 ml. Adding 600 → 720 > 560, close.
    // Jug 2: 600 + 20 = 620 → 1000 ml (none holds it). Adding 50 → 670 > 560, close.
    // Jug 3: 50 + 20 = 70 → 300 ml, filled to its minimum 100; waste 100 − 50 = 50.
    const before = d(100);
    const after = d(50);
    expect(planJugs([before, huge, after], RULES)).toEqual([
      jug(SMALL, 120, 20, 'flat', [before.id]),
      jug(LARGE, 620, 20, 'flat', [huge.id], false),
      jug(SMALL, 100, 50, 'flat', [after.id]),
    ]);
  });

  it('takes the smaller capacity when two pitchers share a fill line', () => {
    // 150 + 20 = 170 ≤ 280 for both, over both minimums; the 400 ml is the smaller pitcher
    // (Jugline's own tie-break, no outside value: the smaller pitcher is quicker to swirl and wash).
    const p400: Pitcher = { capacityMl: 400, fillLineMl: 280, minFillMl: 140 };
    const p500: Pitcher = { capacityMl: 500, fillLineMl: 280, minFillMl: 170 };
    expect(planJugs([d(150)], rules({ pitchers: [p500, p400] }))[0].pitcher).toEqual(p400);
  });

  it('works with no waste allowance', () => {
    // 80 + 80 + 0 = 160 ≤ 160, ≥ 100 → 300 ml pitcher, nothing wasted.
    const a = d(80);
    const b = d(80);
    expect(planJugs([a, b], rules({ wasteMl: 0 }))).toEqual([jug(SMALL, 160, 0, 'flat', [a.id, b.id])]);
  });
});

describe('makeJug', () => {
  it('makes the jug a barista starts, or says no when the drinks cannot share one', () => {
    // Hand-worked from the same rules as planJugs (fill line: common practice; minimum and drinks
    // per jug: from memory). Two flat 60s: 60 + 60 + 20 = 140 ≤ 160, ≥ 100 → 300 ml pitcher.
    const a = d(60);
    const b = d(60);
    expect(makeJug([a, b], RULES)).toEqual(jug(SMALL, 140, 20, 'flat', [a.id, b.id]));
    // Five drinks when the café allows four: no.
    expect(makeJug([d(20), d(20), d(20), d(20), d(20)], RULES)).toBeNull();
    // Two drinks over the largest fill line together (300 + 300 + 20 = 620 > 560): no.
    expect(makeJug([d(300), d(300)], RULES)).toBeNull();
    // No drinks, or no pitchers: no jug.
    expect(makeJug([], RULES)).toBeNull();
    expect(makeJug([a], rules({ pitchers: [] }))).toBeNull();
  });
});

describe('describeJug', () => {
  it('names the pitcher, the cold milk to fill and its waste, the drink count and the stretch', () => {
    // Jugline's own wording (no outside value); the numbers are copied, not computed. "Fill" is
    // for the pitcher, "pour" only for cups; short/medium/long stretch and wet/silky/dry foam are
    // the words baristas use for the texture (common practice).
    expect(describeJug(jug(LARGE, 620, 20, 'flat', [1]))).toBe('1000 ml pitcher · fill to 620 ml (20 ml waste) · 1 drink · short stretch (wet)');
    expect(describeJug(jug(MEDIUM, 260, 0, 'foamy', [1, 2, 3]))).toBe('500 ml pitcher · fill to 260 ml · 3 drinks · long stretch (dry)');
  });

  it("says the volumes in the café's unit: US fl oz to the half ounce", () => {
    // 1 US fl oz = 1/128 US gallon = 29.5735295625 ml (the US customary definition, as in units.test.ts): 1000 ml = 33.8 oz → 34 oz;
    // 620 ml = 20.96 oz → 21 oz; 20 ml = 0.68 oz → 0.5 oz (nearest half, src/domain/units.ts).
    expect(describeJug(jug(LARGE, 620, 20, 'silky', [1]), 'us_floz')).toBe('34 oz pitcher · fill to 21 oz (0.5 oz waste) · 1 drink · medium stretch (silky)');
  });

  it('describes what planJugs plans', () => {
    // 60 + 80 + 20 = 160 ≤ 160 → 300 ml pitcher; silky is foamier than flat (hand-worked as above).
    const [batch] = planJugs([d(60, 'flat'), d(80, 'silky')], RULES);
    expect(describeJug(batch)).toBe('300 ml pitcher · fill to 160 ml (20 ml waste) · 2 drinks · medium stretch (silky)');
  });
});

describe('planJugs (properties)', () => {
  // Every property restates a rule of the plan, each a common-practice rule named in the
  // hand-worked tests above (fill line, growth, minimum fill, drinks per jug, oldest first, pour
  // order); the oracle code below is written independently of src/domain/jug-plan.ts.
  const THICKNESS: Record<string, number> = { flat: 0, silky: 1, foamy: 2 };

  const drinkArb = fc.record({
    milkMl: fc.integer({ min: 0, max: MAX_TEST_DRINK_ML }),
    texture: fc.constantFrom<Texture>('flat', 'silky', 'foamy', 'cold'),
  });
  // Lane of 0–25 drinks; ids are unique and the array order is the lane order (oldest first).
  const laneArb = fc.array(drinkArb, { maxLength: 25 }).map((ds): JugDrink[] => ds.map((x, i) => ({ id: 1000 + i, milkMl: x.milkMl, texture: x.texture })));

  const run = (prop: (lane: JugDrink[], r: JugRules, plan: Jug[]) => void) =>
    fc.assert(
      fc.property(laneArb, rulesArb, (lane, r) => {
        prop(lane, r, planJugs(lane, r));
      }),
      { numRuns: 400 },
    );

  const jugDrinks = (lane: JugDrink[]) => lane.filter((x) => x.milkMl > 0 && x.texture !== 'cold' && x.texture !== null);
  const positionIn = (lane: JugDrink[]) => new Map(lane.map((x, i) => [x.id, i]));
  const milkOf = (lane: JugDrink[]) => new Map(lane.map((x) => [x.id, x.milkMl]));
  const foamiest = (lane: JugDrink[], ids: number[]) => {
    const byId = new Map(lane.map((x) => [x.id, x]));
    return ids.map((id) => byId.get(id)!.texture as string).reduce((m, t) => (THICKNESS[t] > THICKNESS[m] ? t : m), 'flat');
  };
  const holds = pitcherHolds;

  it('(a) puts every drink that needs a jug in exactly one jug, and no other drink', () => {
    run((lane, _r, plan) => {
      const planned = plan.flatMap((b) => b.drinkIds);
      expect([...planned].sort((x, y) => x - y)).toEqual(jugDrinks(lane).map((x) => x.id));
      for (const b of plan) expect(b.jugId).toBeNull();
    });
  });

  it('(b) never fills a pitcher past its fill line, nor lets the milk grow past its brim, nor under its minimum', () => {
    run((_l, r, plan) => {
      for (const b of plan) {
        expect(b.fits).toBe(true);
        expect(b.coldMl).toBeLessThanOrEqual(b.pitcher.fillLineMl);
        expect(b.coldMl * (100 + r.expansionPct[b.steamFor])).toBeLessThanOrEqual(b.pitcher.capacityMl * 100);
        expect(b.coldMl).toBeGreaterThanOrEqual(b.pitcher.minFillMl);
      }
    });
  });

  it('(c) puts the oldest jug drink in the first jug, and no jug holds more drinks than allowed', () => {
    run((lane, r, plan) => {
      const oldest = jugDrinks(lane)[0];
      if (!oldest) {
        expect(plan).toEqual([]);
        return;
      }
      expect(plan[0].drinkIds).toContain(oldest.id);
      for (const b of plan) expect(b.drinkIds.length).toBeLessThanOrEqual(r.maxDrinks);
    });
  });

  it('(d) keeps age order across jugs: no jug skips an older drink', () => {
    run((lane, _r, plan) => {
      const pos = positionIn(lane);
      const inAgeOrder = plan.flatMap((b) => [...b.drinkIds].sort((x, y) => pos.get(x)! - pos.get(y)!));
      expect(inAgeOrder).toEqual(jugDrinks(lane).map((x) => x.id));
    });
  });

  it("(e) pours the drinks' milk plus the waste allowance, or the pitcher's minimum if that is more, and counts the rest as waste", () => {
    run((lane, r, plan) => {
      const milk = milkOf(lane);
      for (const b of plan) {
        const sum = b.drinkIds.reduce((s, id) => s + milk.get(id)!, 0);
        expect(b.coldMl).toBe(Math.max(sum + r.wasteMl, b.pitcher.minFillMl));
        expect(b.wasteMl).toBe(b.coldMl - sum);
      }
    });
  });

  it('(f) uses the smallest pitcher that holds the jug', () => {
    run((lane, r, plan) => {
      const milk = milkOf(lane);
      const bySize = [...r.pitchers].sort((a, b) => a.fillLineMl - b.fillLineMl || a.capacityMl - b.capacityMl);
      for (const b of plan) {
        const sum = b.drinkIds.reduce((s, id) => s + milk.get(id)!, 0);
        expect(b.pitcher).toEqual(bySize.find((p) => holds(p, sum, b.steamFor, r)));
      }
    });
  });

  it('(g) closes a jug only when the next drink would break a rule (drinks per jug, fill line, growth)', () => {
    run((lane, r, plan) => {
      const milk = milkOf(lane);
      const pos = positionIn(lane);
      for (let i = 0; i + 1 < plan.length; i++) {
        const next = [...plan[i + 1].drinkIds].sort((x, y) => pos.get(x)! - pos.get(y)!)[0];
        const ids = [...plan[i].drinkIds, next];
        const sum = ids.reduce((s, id) => s + milk.get(id)!, 0);
        const full = plan[i].drinkIds.length >= r.maxDrinks;
        expect(full || !r.pitchers.some((p) => holds(p, sum, foamiest(lane, ids) as 'flat', r))).toBe(true);
      }
    });
  });

  it('(h) steams for the foamiest texture and pours thinnest first, oldest first within a texture', () => {
    run((lane, _r, plan) => {
      const byId = new Map(lane.map((x) => [x.id, x]));
      const pos = positionIn(lane);
      for (const b of plan) {
        expect(b.steamFor).toBe(foamiest(lane, b.drinkIds));
        const expected = [...b.drinkIds].sort((x, y) => THICKNESS[byId.get(x)!.texture!] - THICKNESS[byId.get(y)!.texture!] || pos.get(x)! - pos.get(y)!);
        expect(b.drinkIds).toEqual(expected);
      }
    });
  });
});

describe("kids' temperature", () => {
  const kids = (milkMl: number): JugDrink => ({ ...d(milkMl, 'silky'), kidsTemp: true });

  it('a drink steamed cooler never shares a jug with drinks steamed as usual, and the plan stays oldest first', () => {
    const [a, b, c, e] = [d(100, 'silky'), kids(100), kids(100), d(100, 'silky')];
    const jugs = planJugs([a, b, c, e], RULES);
    // by milk alone all four fit one large jug; by temperature they go usual | kids | usual
    expect(jugs.map((j) => j.drinkIds)).toEqual([[a.id], [b.id, c.id], [e.id]]);
    expect(jugs.map((j) => !!j.kidsTemp)).toEqual([false, true, false]);
    expect(makeJug([a, b], RULES)).toBeNull();
  });

  it('the jug line says how cool to stop, in both scales', () => {
    const [only] = planJugs([kids(100)], RULES);
    // 50 °C = 122 °F (°F = 1.8 × °C + 32)
    expect(describeJug(only)).toBe(
      "300 ml pitcher · fill to 120 ml (20 ml waste) · 1 drink · medium stretch (silky) · kids' temperature: stop at about 50 °C / 122 °F",
    );
  });
});
