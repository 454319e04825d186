import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { describeBatch, needsJug, planJugs, type JugBatch, type JugDrink, type Pitcher } from '../../src/domain/jug-plan';
import type { Texture } from '../../src/domain/types';

// Invented pitchers for these tests (not the demo café's). The fill line sits below the
// capacity: common practice is to fill a milk pitcher with cold milk to just below the base of
// the spout (check-values.md, "Espresso and beans"), so the usable cold-milk volume is well under
// the brim. The numbers themselves are invented.
const SMALL: Pitcher = { capacityMl: 300, fillLineMl: 160 };
const MEDIUM: Pitcher = { capacityMl: 500, fillLineMl: 280 };
const LARGE: Pitcher = { capacityMl: 1000, fillLineMl: 560 };
// Deliberately out of size order: planJugs takes pitchers in any order.
const PITCHERS = [LARGE, SMALL, MEDIUM];
const WASTE = 20;

let nextId = 1;
function d(milkMl: number, texture: Texture | null = 'flat'): JugDrink {
  return { id: nextId++, milkMl, texture };
}

describe('needsJug', () => {
  it('is true only for a steamed texture with some milk', () => {
    expect(needsJug({ id: 1, milkMl: 150, texture: 'flat' })).toBe(true);
    expect(needsJug({ id: 1, milkMl: 150, texture: 'silky' })).toBe(true);
    expect(needsJug({ id: 1, milkMl: 150, texture: 'foamy' })).toBe(true);
    // Iced drinks take cold milk straight from the fridge.
    expect(needsJug({ id: 1, milkMl: 150, texture: 'cold' })).toBe(false);
    expect(needsJug({ id: 1, milkMl: 0, texture: 'flat' })).toBe(false);
    expect(needsJug({ id: 1, milkMl: 150, texture: null })).toBe(false);
  });
});

describe('planJugs (hand-worked)', () => {
  it('puts one flat white alone in the smallest pitcher that holds it', () => {
    // 150 ml milk + 20 ml waste = 170 ml cold milk.
    // 170 > 160 (300 ml pitcher's fill line), 170 ≤ 280 (500 ml) → 500 ml pitcher.
    const fw = d(150, 'flat');
    expect(planJugs([fw], PITCHERS, WASTE)).toEqual([{ pitcher: MEDIUM, coldMl: 170, steamFor: 'flat', drinkIds: [fw.id] }]);

    // A smaller drink: 120 + 20 = 140 ≤ 160 → 300 ml pitcher.
    const cortado = d(120, 'silky');
    expect(planJugs([cortado], PITCHERS, WASTE)).toEqual([
      { pitcher: SMALL, coldMl: 140, steamFor: 'silky', drinkIds: [cortado.id] },
    ]);

    // Exactly on the fill line still fits: 140 + 20 = 160 ≤ 160 → 300 ml pitcher.
    const edge = d(140, 'flat');
    expect(planJugs([edge], PITCHERS, WASTE)[0].pitcher).toEqual(SMALL);
    // One more ml does not: 141 + 20 = 161 > 160 → 500 ml pitcher.
    expect(planJugs([d(141, 'flat')], PITCHERS, WASTE)[0].pitcher).toEqual(MEDIUM);
  });

  it('steams three drinks that fit together as one batch in the smallest pitcher that holds the sum', () => {
    // 60 + 80 + 100 = 240 ml, + 20 waste = 260 ml.
    // 260 > 160 (300 ml), 260 ≤ 280 (500 ml) → one batch in the 500 ml pitcher.
    // All flat → pour in lane order (oldest first).
    const a = d(60);
    const b = d(80);
    const c = d(100);
    expect(planJugs([a, b, c], PITCHERS, WASTE)).toEqual([
      { pitcher: MEDIUM, coldMl: 260, steamFor: 'flat', drinkIds: [a.id, b.id, c.id] },
    ]);
  });

  it('fills the largest pitcher exactly to its fill line without closing the batch', () => {
    // 200 + 300 + 40 = 540, + 20 waste = 560 = 560 (1000 ml fill line) → still one batch.
    const a = d(200);
    const b = d(300);
    const c = d(40);
    expect(planJugs([a, b, c], PITCHERS, WASTE)).toEqual([
      { pitcher: LARGE, coldMl: 560, steamFor: 'flat', drinkIds: [a.id, b.id, c.id] },
    ]);
  });

  it('closes the batch at an older drink that does not fit, rather than skipping it for a newer small one', () => {
    // Lane order (oldest first): 200, 300, 60, 30; waste 20; largest fill line 560.
    // Batch 1: 200 + 300 + 20 = 520 ≤ 560. Adding 60 → 580 > 560, so the batch closes here.
    //   The 30 ml drink would still fit (200 + 300 + 30 + 20 = 550) but taking it would skip the
    //   older 60 ml drink — never done: common practice is that batching never makes an older
    //   ticket wait.
    //   520 > 280 → 1000 ml pitcher.
    // Batch 2: 60 + 30 + 20 = 110 ≤ 160 → 300 ml pitcher.
    const a = d(200);
    const b = d(300);
    const c = d(60);
    const e = d(30);
    expect(planJugs([a, b, c, e], PITCHERS, WASTE)).toEqual([
      { pitcher: LARGE, coldMl: 520, steamFor: 'flat', drinkIds: [a.id, b.id] },
      { pitcher: SMALL, coldMl: 110, steamFor: 'flat', drinkIds: [c.id, e.id] },
    ]);
  });

  it('splits a batch too large for the biggest pitcher into two, each in the right pitcher', () => {
    // Four 150 ml drinks, waste 20.
    // Batch 1: 150 × 3 + 20 = 470 ≤ 560; a fourth → 620 > 560, close. 470 > 280 → 1000 ml pitcher.
    // Batch 2: 150 + 20 = 170; 170 > 160, ≤ 280 → 500 ml pitcher.
    const ds = [d(150), d(150), d(150), d(150)];
    expect(planJugs(ds, PITCHERS, WASTE)).toEqual([
      { pitcher: LARGE, coldMl: 470, steamFor: 'flat', drinkIds: [ds[0].id, ds[1].id, ds[2].id] },
      { pitcher: MEDIUM, coldMl: 170, steamFor: 'flat', drinkIds: [ds[3].id] },
    ]);
  });

  it('steams mixed textures for the foamiest and pours thinnest first, oldest first within a texture', () => {
    // Common practice: steam for the foamiest drink in the jug and pour thinnest first, since the
    // foam rises to the top as the jug empties.
    // Lane order: A foamy 80, B flat 60, C silky 50, D flat 40.
    // 80 + 60 + 50 + 40 = 230, + 20 = 250 ≤ 280 (and > 160) → 500 ml pitcher.
    // Steam for foamy (A). Pour order: flat B, flat D (B older), silky C, foamy A.
    const A = d(80, 'foamy');
    const B = d(60, 'flat');
    const C = d(50, 'silky');
    const D = d(40, 'flat');
    expect(planJugs([A, B, C, D], PITCHERS, WASTE)).toEqual([
      { pitcher: MEDIUM, coldMl: 250, steamFor: 'foamy', drinkIds: [B.id, D.id, C.id, A.id] },
    ]);

    // No foamy drink: silky wins. Lane: silky 70, flat 50 → 70 + 50 + 20 = 140 ≤ 160 → 300 ml.
    // Pour: flat first, then silky.
    const S = d(70, 'silky');
    const F = d(50, 'flat');
    expect(planJugs([S, F], PITCHERS, WASTE)).toEqual([
      { pitcher: SMALL, coldMl: 140, steamFor: 'silky', drinkIds: [F.id, S.id] },
    ]);
  });

  it('gives iced drinks and drinks without milk no jug and leaves them out of every batch', () => {
    // Lane: iced latte 200 (cold), espresso-style 0 ml flat, untextured 150, flat 100.
    // Only the flat 100 needs a jug: 100 + 20 = 120 ≤ 160 → 300 ml pitcher.
    const iced = d(200, 'cold');
    const noMilk = d(0, 'flat');
    const untextured = d(150, null);
    const fw = d(100, 'flat');
    expect(planJugs([iced, noMilk, untextured, fw], PITCHERS, WASTE)).toEqual([
      { pitcher: SMALL, coldMl: 120, steamFor: 'flat', drinkIds: [fw.id] },
    ]);
    // A lane of only such drinks has no jug plan.
    expect(planJugs([iced, noMilk, untextured], PITCHERS, WASTE)).toEqual([]);
    expect(planJugs([], PITCHERS, WASTE)).toEqual([]);
  });

  it('plans nothing when the location has no pitchers', () => {
    expect(planJugs([d(150), d(100)], [], WASTE)).toEqual([]);
  });

  it('gives a single drink bigger than every fill line the largest pitcher, alone', () => {
    // 600 + 20 = 620 > 560 (largest fill line) → 1000 ml pitcher, by itself.
    const huge = d(600);
    expect(planJugs([huge], PITCHERS, WASTE)).toEqual([{ pitcher: LARGE, coldMl: 620, steamFor: 'flat', drinkIds: [huge.id] }]);

    // Between two small drinks it is still alone:
    // Batch 1: 100 + 20 = 120 ≤ 160 → 300 ml. Adding 600 → 720 > 560, close.
    // Batch 2: 600 + 20 = 620 → 1000 ml (none holds it). Adding 50 → 670 > 560, close.
    // Batch 3: 50 + 20 = 70 ≤ 160 → 300 ml.
    const before = d(100);
    const after = d(50);
    expect(planJugs([before, huge, after], PITCHERS, WASTE)).toEqual([
      { pitcher: SMALL, coldMl: 120, steamFor: 'flat', drinkIds: [before.id] },
      { pitcher: LARGE, coldMl: 620, steamFor: 'flat', drinkIds: [huge.id] },
      { pitcher: SMALL, coldMl: 70, steamFor: 'flat', drinkIds: [after.id] },
    ]);
  });

  it('takes the smaller capacity when two pitchers share a fill line', () => {
    // 150 + 20 = 170 ≤ 280 for both; the 400 ml is the smaller pitcher.
    const p400: Pitcher = { capacityMl: 400, fillLineMl: 280 };
    const p500: Pitcher = { capacityMl: 500, fillLineMl: 280 };
    expect(planJugs([d(150)], [p500, p400], WASTE)[0].pitcher).toEqual(p400);
  });

  it('works with no waste allowance', () => {
    // 80 + 80 + 0 = 160 ≤ 160 → 300 ml pitcher.
    const a = d(80);
    const b = d(80);
    expect(planJugs([a, b], PITCHERS, 0)).toEqual([{ pitcher: SMALL, coldMl: 160, steamFor: 'flat', drinkIds: [a.id, b.id] }]);
  });
});

describe('describeBatch', () => {
  it('names the pitcher, the cold milk, the drink count and the texture', () => {
    const one: JugBatch = { pitcher: LARGE, coldMl: 620, steamFor: 'flat', drinkIds: [1] };
    expect(describeBatch(one)).toBe('1000 ml pitcher · pour 620 ml · 1 drink · steam flat');
    const three: JugBatch = { pitcher: MEDIUM, coldMl: 260, steamFor: 'foamy', drinkIds: [1, 2, 3] };
    expect(describeBatch(three)).toBe('500 ml pitcher · pour 260 ml · 3 drinks · steam foamy');
  });

  it('describes what planJugs plans', () => {
    // 60 + 80 + 20 = 160 ≤ 160 → 300 ml pitcher; silky is foamier than flat.
    const [batch] = planJugs([d(60, 'flat'), d(80, 'silky')], PITCHERS, WASTE);
    expect(describeBatch(batch)).toBe('300 ml pitcher · pour 160 ml · 2 drinks · steam silky');
  });
});

describe('planJugs (properties)', () => {
  const THICKNESS: Record<string, number> = { flat: 0, silky: 1, foamy: 2 };

  const drinkArb = fc.record({
    milkMl: fc.integer({ min: 0, max: 300 }),
    texture: fc.constantFrom<Texture>('flat', 'silky', 'foamy', 'cold'),
  });
  // Lane of 0–25 drinks; ids are unique and the array order is the lane order (oldest first).
  const laneArb = fc
    .array(drinkArb, { maxLength: 25 })
    .map((ds): JugDrink[] => ds.map((x, i) => ({ id: 1000 + i, milkMl: x.milkMl, texture: x.texture })));
  const pitcherArb = (minFill: number) =>
    fc
      .record({ fillLineMl: fc.integer({ min: minFill, max: 900 }), headroom: fc.integer({ min: 0, max: 600 }) })
      .map(({ fillLineMl, headroom }): Pitcher => ({ capacityMl: fillLineMl + headroom, fillLineMl }));
  // 1–4 pitchers, fill line ≤ capacity. At least one has a fill line ≥ 320, so any one drink
  // (≤ 300 ml) plus waste (≤ 20 ml) fits the largest; the others may be small, so the choice of
  // pitcher matters. The big one is put at a random place: order must not matter.
  const pitchersArb = fc
    .tuple(pitcherArb(320), fc.array(pitcherArb(40), { maxLength: 3 }), fc.nat())
    .map(([big, others, at]) => {
      const all = [...others];
      all.splice(at % (others.length + 1), 0, big);
      return all;
    });
  const wasteArb = fc.integer({ min: 0, max: 20 });

  const run = (prop: (lane: JugDrink[], pitchers: Pitcher[], waste: number, plan: JugBatch[]) => void) =>
    fc.assert(
      fc.property(laneArb, pitchersArb, wasteArb, (lane, pitchers, waste) => {
        prop(lane, pitchers, waste, planJugs(lane, pitchers, waste));
      }),
      { numRuns: 500 },
    );

  const jugDrinks = (lane: JugDrink[]) => lane.filter((x) => x.milkMl > 0 && x.texture !== 'cold');
  const positionIn = (lane: JugDrink[]) => new Map(lane.map((x, i) => [x.id, i]));

  it('(a) puts every drink that needs a jug in exactly one batch, and no other drink', () => {
    run((lane, _p, _w, plan) => {
      const planned = plan.flatMap((b) => b.drinkIds);
      expect([...planned].sort((x, y) => x - y)).toEqual(jugDrinks(lane).map((x) => x.id));
    });
  });

  it("(b) never fills a pitcher past its fill line", () => {
    run((_l, _p, _w, plan) => {
      for (const b of plan) expect(b.coldMl).toBeLessThanOrEqual(b.pitcher.fillLineMl);
    });
  });

  it('(c) puts the oldest jug drink in the first batch', () => {
    run((lane, _p, _w, plan) => {
      const oldest = jugDrinks(lane)[0];
      if (!oldest) {
        expect(plan).toEqual([]);
        return;
      }
      expect(plan[0].drinkIds).toContain(oldest.id);
    });
  });

  it('(d) keeps age order across batches: no batch skips an older drink', () => {
    run((lane, _p, _w, plan) => {
      const pos = positionIn(lane);
      const inAgeOrder = plan.flatMap((b) => [...b.drinkIds].sort((x, y) => pos.get(x)! - pos.get(y)!));
      expect(inAgeOrder).toEqual(jugDrinks(lane).map((x) => x.id));
    });
  });

  it("(e) pours the batch's milk plus the waste allowance", () => {
    run((lane, _p, waste, plan) => {
      const milk = new Map(lane.map((x) => [x.id, x.milkMl]));
      for (const b of plan) expect(b.coldMl).toBe(b.drinkIds.reduce((s, id) => s + milk.get(id)!, 0) + waste);
    });
  });

  it('(f) uses the smallest pitcher whose fill line holds the batch', () => {
    run((_l, pitchers, _w, plan) => {
      for (const b of plan) {
        const holding = pitchers.filter((p) => p.fillLineMl >= b.coldMl);
        const smallest = holding.reduce((m, p) =>
          p.fillLineMl < m.fillLineMl || (p.fillLineMl === m.fillLineMl && p.capacityMl < m.capacityMl) ? p : m,
        );
        expect(b.pitcher).toEqual(smallest);
      }
    });
  });

  it('(g) closes a batch only when the next drink would overfill the largest pitcher', () => {
    run((lane, pitchers, _w, plan) => {
      const largestFill = Math.max(...pitchers.map((p) => p.fillLineMl));
      const milk = new Map(lane.map((x) => [x.id, x.milkMl]));
      const pos = positionIn(lane);
      for (let i = 0; i + 1 < plan.length; i++) {
        const nextOldest = [...plan[i + 1].drinkIds].sort((x, y) => pos.get(x)! - pos.get(y)!)[0];
        expect(plan[i].coldMl + milk.get(nextOldest)!).toBeGreaterThan(largestFill);
      }
    });
  });

  it('(h) steams for the foamiest texture and pours thinnest first, oldest first within a texture', () => {
    run((lane, _p, _w, plan) => {
      const byId = new Map(lane.map((x) => [x.id, x]));
      const pos = positionIn(lane);
      for (const b of plan) {
        const ts = b.drinkIds.map((id) => THICKNESS[byId.get(id)!.texture!]);
        expect(THICKNESS[b.steamFor]).toBe(Math.max(...ts));
        const expected = [...b.drinkIds].sort(
          (x, y) => THICKNESS[byId.get(x)!.texture!] - THICKNESS[byId.get(y)!.texture!] || pos.get(x)! - pos.get(y)!,
        );
        expect(b.drinkIds).toEqual(expected);
      }
    });
  });
});
