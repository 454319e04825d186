import { describe, it, expect } from 'vitest';
import type { Jug, JugRules, Pitcher } from '@/domain/jug-plan';
import { groupIntoLanes, hasAllergy, needsAllergyAck, planBar } from '@/domain/lanes';
import type { DrinkStatus, DrinkView, JugRef, MilkRef, Texture, TicketView } from '@/domain/types';
import { plannedJug } from '../support/jugs';

const OAT: MilkRef = { id: 7, name: 'Oat', code: 'OT' };
const WHOLE: MilkRef = { id: 3, name: 'Whole', code: 'WM' };

// Invented pitchers (not the demo café's). Fill lines below capacity: common practice is to fill
// a milk pitcher with cold milk to just below the base of the spout (docs/check-values.md); a
// minimum fill of about a third of the capacity keeps the steam tip covered (common practice, from
// memory). The numbers are invented.
const SMALL: Pitcher = { capacityMl: 300, fillLineMl: 160, minFillMl: 100 };
const MEDIUM: Pitcher = { capacityMl: 500, fillLineMl: 280, minFillMl: 170 };
const LARGE: Pitcher = { capacityMl: 1000, fillLineMl: 560, minFillMl: 340 };
const WASTE = 20;
// At most 4 drinks a jug; milk grows 15 % flat, 25 % silky, 75 % foamy when steamed (common
// practice, from memory: about 10–20 %, 20–30 % and 50–100 %).
const rulesWith = (wasteMl: number): JugRules => ({
  pitchers: [SMALL, MEDIUM, LARGE],
  wasteMl,
  maxDrinks: 4,
  expansionPct: { flat: 15, silky: 25, foamy: 75 },
});
const RULES = rulesWith(WASTE);
const planned = plannedJug;

// Doses in tenths of a gram. Double: 19 g = 190 dg, inside the common-practice 18–22 g for a
// double shot (docs/check-values.md, no published source). Single: 7 g = 70 dg, the Istituto
// Nazionale Espresso Italiano's 7 ± 0.5 g per single (docs/check-values.md, confirmed).
const DOUBLE_DG = 190;
const SINGLE_DG = 70;

interface DrinkOpts {
  milk?: MilkRef | null;
  shots?: 1 | 2;
  milkMl?: number;
  texture?: Texture | null;
  status?: DrinkStatus;
  allergyAckAt?: string | null;
  jug?: JugRef | null;
}

let nextDrinkId = 1;
function drink(ticketId: number, o: DrinkOpts = {}): DrinkView {
  const milk = o.milk === undefined ? OAT : o.milk;
  const shots = o.shots ?? 2;
  return {
    id: nextDrinkId++,
    ticketId,
    itemName: milk ? 'Flat white' : 'Long black',
    sizeName: null,
    volumeMl: null,
    milk,
    shots,
    milkMl: o.milkMl ?? (milk ? 150 : 0),
    texture: o.texture !== undefined ? o.texture : milk ? 'flat' : null,
    extras: [],
    note: null,
    contains: [],
    doseDg: shots === 2 ? DOUBLE_DG : SINGLE_DG,
    status: o.status ?? 'queued',
    startedAt: o.status === 'making' ? '2025-03-01T08:20:00.000Z' : null,
    doneAt: null,
    allergyAckAt: o.allergyAckAt ?? null,
    allergyAckBy: o.allergyAckAt ? 'Sam' : null,
    jug: o.jug ?? null,
  };
}

interface TicketOpts {
  rushedAt?: string | null;
  allergens?: string[];
  allergyNote?: string | null;
}

function ticket(id: number, firedAt: string, drinks: DrinkView[], o: TicketOpts = {}): TicketView {
  return {
    id,
    number: 100 + id,
    customerName: `Guest ${id}`,
    status: 'open',
    firedAt,
    readyAt: null,
    collectedAt: null,
    service: 'takeaway',
    allergens: o.allergens ?? [],
    allergyNote: o.allergyNote ?? null,
    rushedAt: o.rushedAt ?? null,
    drinks,
  };
}

const at = (hhmm: string) => `2025-03-01T${hhmm}:00.000Z`;

describe('planBar', () => {
  it('gives each lane its jug plan and shot plan, and adds the shot plans up', () => {
    const flatWhite = drink(1, { milk: OAT, milkMl: 150, texture: 'flat' });
    const longBlackMaking = drink(1, { milk: null, status: 'making' });
    const cappuccino = drink(2, { milk: OAT, milkMl: 180, texture: 'foamy' });
    const longBlack = drink(2, { milk: null });
    const latte = drink(3, { milk: WHOLE, shots: 1, milkMl: 200, texture: 'silky' });
    const { lanes, shotPlan } = planBar(
      [ticket(1, at('08:00'), [flatWhite, longBlackMaking]), ticket(2, at('08:02'), [cappuccino, longBlack]), ticket(3, at('08:03'), [latte])],
      RULES,
    );

    // The menu's milk order (here no places given: by id, Whole 3 before Oat 7), no milk last
    // (Jugline's own lane order, no outside value).
    expect(lanes.map((l) => l.key)).toEqual(['milk:3', 'milk:7', 'none']);
    const [whole, oat, none] = lanes;

    // Oat: 150 + 180 + 20 waste = 350 ml; 350 > 280, ≤ 560, ≥ 340 (minimum) and 350 × 1.75 =
    // 612.5 ≤ 1000 → 1000 ml pitcher, one jug (hand-worked from the rules above). Steam for foamy
    // (the cappuccino); pour the flat white first, then the cappuccino (common practice).
    expect(oat.jugPlan).toEqual([planned(LARGE, 350, 20, 'foamy', [flatWhite.id, cappuccino.id])]);
    // Two queued doubles: 4 shots, 2 × 190 = 380 dg (dose: common practice, above).
    expect(oat.shotPlan).toEqual({ shots: 4, doseDg: 380 });

    // No milk: no jug. Only the queued long black counts; the one being made is already pulled
    // (common practice: shots are pulled when a drink is started).
    expect(none.jugPlan).toEqual([]);
    expect(none.drinkCount).toBe(2);
    expect(none.shotPlan).toEqual({ shots: 2, doseDg: 190 });

    // Whole: 200 + 20 = 220 ml; 220 > 160, ≤ 280, ≥ 170, 220 × 1.25 = 275 ≤ 500 → 500 ml pitcher.
    // One single: 1 shot, 70 dg (INEI, above).
    expect(whole.jugPlan).toEqual([planned(MEDIUM, 220, 20, 'silky', [latte.id])]);
    expect(whole.shotPlan).toEqual({ shots: 1, doseDg: 70 });

    // Totals: 4 + 2 + 1 = 7 shots; 380 + 190 + 70 = 640 dg (the doses above, added by hand).
    expect(shotPlan).toEqual({ shots: 7, doseDg: 640 });
    expect(shotPlan.shots).toBe(lanes.reduce((n, l) => n + l.shotPlan.shots, 0));
    expect(shotPlan.doseDg).toBe(lanes.reduce((n, l) => n + l.shotPlan.doseDg, 0));
  });

  it('keeps lanes as groupIntoLanes makes them', () => {
    const tickets = [ticket(1, at('08:00'), [drink(1, { milk: OAT, shots: 1 }), drink(1, { milk: WHOLE })]), ticket(2, at('08:04'), [drink(2, { milk: OAT })])];
    const { lanes } = planBar(tickets, RULES);
    // The planned lanes are the grouped lanes plus their plans (Jugline's own shape, no outside value).
    expect(lanes.map(({ jugPlan: _j, shotPlan: _s, ...lane }) => lane)).toEqual(groupIntoLanes(tickets));
  });

  it('counts no shots or dose for drinks already being made or done', () => {
    // Common practice: a started drink's shots are being pulled; a done drink's are in the cup.
    const { lanes, shotPlan } = planBar([ticket(1, at('08:00'), [drink(1, { status: 'making' }), drink(1, { status: 'done' })])], RULES);
    expect(lanes).toHaveLength(1);
    expect(lanes[0].shotPlan).toEqual({ shots: 0, doseDg: 0 });
    expect(shotPlan).toEqual({ shots: 0, doseDg: 0 });
  });

  it('puts a rushed ticket first in its lane and at the head of the jug plan, though newer', () => {
    // Common practice: a lead can move a ticket to the front of the bar.
    const old1 = drink(1, { milkMl: 200 });
    const old2 = drink(2, { milkMl: 200 });
    const rushed = drink(3, { milkMl: 200 });
    const { lanes } = planBar(
      [ticket(1, at('08:00'), [old1]), ticket(2, at('08:05'), [old2]), ticket(3, at('08:10'), [rushed], { rushedAt: at('08:12') })],
      RULES,
    );
    expect(lanes).toHaveLength(1);
    // Lane order: rushed (08:10, rushed 08:12), then 08:00, then 08:05.
    expect(lanes[0].drinks.map((c) => c.ticketId)).toEqual([3, 1, 2]);
    // Jug 1: 200 + 200 + 20 = 420 ≤ 560; adding the third → 620 > 560, close. 420 > 280 → 1000 ml
    //   (≥ 340, 420 × 1.15 = 483 ≤ 1000). All flat, so they pour in lane order: the rushed drink first.
    // Jug 2: 200 + 20 = 220 ≤ 280, ≥ 170 → 500 ml. (Hand-worked from the rules above.)
    expect(lanes[0].jugPlan).toEqual([planned(LARGE, 420, 20, 'flat', [rushed.id, old1.id]), planned(MEDIUM, 220, 20, 'flat', [old2.id])]);
  });

  it('plans jugs over the whole lane in lane order, whatever the shot counts', () => {
    // The lane lists the rushed double first, before the older single, and so does the jug plan.
    const oldSingle = drink(1, { shots: 1, milkMl: 100 });
    const rushedDouble = drink(2, { shots: 2, milkMl: 100 });
    const { lanes } = planBar(
      [ticket(1, at('08:00'), [oldSingle]), ticket(2, at('08:09'), [rushedDouble], { rushedAt: at('08:10') })],
      // No waste: 100 + 100 = 200 ≤ 280 (> 160), ≥ 170 → 500 ml; both flat, pour in lane order.
      rulesWith(0),
    );
    expect(lanes[0].drinks.map((c) => c.id)).toEqual([rushedDouble.id, oldSingle.id]);
    expect(lanes[0].jugPlan).toEqual([planned(MEDIUM, 200, 0, 'flat', [rushedDouble.id, oldSingle.id])]);
  });

  it('without a rush, leads the lane and the jug plan with the oldest ticket, a double before a newer single', () => {
    // Oldest is a double (08:00), newer is a single (08:04).
    // Jug: 150 + 150 + 20 = 320 > 280, ≤ 560 → 1000 ml, filled to its minimum 340 (waste
    // 340 − 300 = 40); pour oldest first. (Hand-worked from the rules above.)
    const oldDouble = drink(1, { shots: 2 });
    const newSingle = drink(2, { shots: 1 });
    const { lanes } = planBar([ticket(2, at('08:04'), [newSingle]), ticket(1, at('08:00'), [oldDouble])], RULES);
    expect(lanes[0].drinks.map((c) => c.id)).toEqual([oldDouble.id, newSingle.id]);
    expect(lanes[0].jugPlan).toEqual([planned(LARGE, 340, 40, 'flat', [oldDouble.id, newSingle.id])]);
  });
});

describe('planBar with started jugs', () => {
  /** A jug as the server stores it when a barista starts it (its pour is fixed from then on). */
  const started = (id: number, b: Jug): JugRef => ({ id, pitcher: b.pitcher, coldMl: b.coldMl, wasteMl: b.wasteMl, steamFor: b.steamFor, fits: b.fits });

  it('keeps a started jug as it was started when a newer drink arrives: the newcomer goes to the next jug', () => {
    // Common practice: milk already in the pitcher is not topped up for a drink that arrives later.
    // The reported sequence. Jug 1 was started with the flat white alone: 150 + 20 = 170 ml in the
    // 500 ml pitcher (hand-worked above). Then a cappuccino arrives (180 ml foamy).
    const jug1 = started(41, planned(MEDIUM, 170, 20, 'flat', []));
    const flatWhite = drink(1, { milkMl: 150, texture: 'flat', status: 'making', jug: jug1 });
    const cappuccino = drink(2, { milkMl: 180, texture: 'foamy' });
    const { lanes } = planBar([ticket(1, at('08:00'), [flatWhite]), ticket(2, at('08:01'), [cappuccino])], RULES);
    // Jug 1 still holds only the flat white, with the pour it was started with. The cappuccino is
    // jug 2: 180 + 20 = 200 > 160; ≤ 280, ≥ 170, 200 × 1.75 = 350 ≤ 500 → 500 ml pitcher.
    expect(lanes[0].jugPlan).toEqual([{ ...planned(MEDIUM, 170, 20, 'flat', [flatWhite.id]), jugId: 41 }, planned(MEDIUM, 200, 20, 'foamy', [cappuccino.id])]);
  });

  it("lists a started jug's drinks still on the bar, thinnest first, and keeps its pour though some were bumped", () => {
    // Jug 7 was started with a foamy, a flat and a silky drink; the flat one was bumped on its own.
    // Pour order (common practice): silky before foamy. The pour stays as started: the milk is
    // already in the pitcher (common practice).
    const jug7 = started(7, planned(LARGE, 400, 20, 'foamy', []));
    const foamy = drink(1, { texture: 'foamy', milkMl: 120, status: 'making', jug: jug7 });
    const flat = { ...drink(1, { texture: 'flat', milkMl: 130, jug: jug7 }), status: 'done' as const };
    const silky = drink(2, { texture: 'silky', milkMl: 130, status: 'making', jug: jug7 });
    const { lanes } = planBar([ticket(1, at('08:00'), [foamy, flat]), ticket(2, at('08:01'), [silky])], RULES);
    expect(lanes[0].jugPlan).toEqual([{ ...planned(LARGE, 400, 20, 'foamy', [silky.id, foamy.id]), jugId: 7 }]);
  });

  it('puts started jugs first, in the order they were started, then plans the queued drinks oldest first', () => {
    // Jugline's own order (no outside value): what is on the steam wand comes first.
    const jugA = started(3, planned(SMALL, 140, 20, 'flat', []));
    const jugB = started(9, planned(SMALL, 140, 20, 'flat', []));
    // Ticket 1 (oldest) is queued; tickets 2 and 3 are in started jugs 9 and 3.
    const queued = drink(1, { milkMl: 120 });
    const inB = drink(2, { milkMl: 120, status: 'making', jug: jugB });
    const inA = drink(3, { milkMl: 120, status: 'making', jug: jugA });
    // A drink started on its own before jugs existed for it (or recalled after a bump straight
    // from the queue) is being made outside any jug: the plan leaves it out.
    const outside = drink(4, { milkMl: 120, status: 'making' });
    const { lanes } = planBar(
      [ticket(1, at('08:00'), [queued]), ticket(2, at('08:01'), [inB]), ticket(3, at('08:02'), [inA]), ticket(4, at('08:03'), [outside])],
      RULES,
    );
    // The queued drink: 120 + 20 = 140 ≤ 160, ≥ 100 → 300 ml pitcher (hand-worked as above).
    expect(lanes[0].jugPlan.map((b) => [b.jugId, b.drinkIds])).toEqual([
      [3, [inA.id]],
      [9, [inB.id]],
      [null, [queued.id]],
    ]);
    expect(lanes[0].drinkCount).toBe(4);
  });

  it('a rush reorders only the jugs not started yet', () => {
    // Common practice: a rush goes to the front of what is still to be made, not into a jug
    // already steaming.
    const jug1 = started(5, planned(MEDIUM, 170, 20, 'flat', []));
    const making = drink(1, { milkMl: 150, status: 'making', jug: jug1 });
    const older = drink(2, { milkMl: 200 });
    const rushed = drink(3, { milkMl: 200 });
    const { lanes } = planBar(
      [ticket(1, at('08:00'), [making]), ticket(2, at('08:01'), [older]), ticket(3, at('08:05'), [rushed], { rushedAt: at('08:06') })],
      RULES,
    );
    // Planned: 200 + 200 + 20 = 420 → 1000 ml pitcher, the rushed drink poured first (as above).
    expect(lanes[0].jugPlan).toEqual([{ ...planned(MEDIUM, 170, 20, 'flat', [making.id]), jugId: 5 }, planned(LARGE, 420, 20, 'flat', [rushed.id, older.id])]);
  });
});

describe('needsAllergyAck', () => {
  const cardsOf = (tickets: TicketView[]) =>
    new Map(
      groupIntoLanes(tickets)
        .flatMap((l) => l.drinks)
        .map((c) => [c.id, c]),
    );

  it("is true for a drink of a ticket with allergens or an allergy note until it's acknowledged", () => {
    // Jugline's own rule (no outside value): an allergy is read before the drink is bumped. The
    // tags are real: tree nuts and milk are US major allergens (FALCPA, docs/check-values.md).
    const withAllergen = drink(1);
    const withNote = drink(2);
    const acked = drink(3, { allergyAckAt: at('08:06') });
    const plain = drink(4);
    const cards = cardsOf([
      ticket(1, at('08:00'), [withAllergen], { allergens: ['tree nuts'] }),
      ticket(2, at('08:01'), [withNote], { allergyNote: 'Coeliac, no oat milk' }),
      ticket(3, at('08:02'), [acked], { allergens: ['milk'], allergyNote: 'Severe' }),
      ticket(4, at('08:03'), [plain]),
    ]);

    expect(cards.get(withAllergen.id)!.allergens).toEqual(['tree nuts']);
    expect(needsAllergyAck(cards.get(withAllergen.id)!)).toBe(true);
    expect(needsAllergyAck(cards.get(withNote.id)!)).toBe(true);
    expect(needsAllergyAck(cards.get(acked.id)!)).toBe(false);
    expect(hasAllergy(cards.get(acked.id)!)).toBe(true);
    expect(needsAllergyAck(cards.get(plain.id)!)).toBe(false);
    expect(hasAllergy(cards.get(plain.id)!)).toBe(false);
  });

  it('turns false once allergyAckAt is set on the same drink', () => {
    // Jugline's own rule (no outside value); soybeans are a US major allergen (FALCPA, docs/check-values.md).
    const t = (ackAt: string | null) => ticket(1, at('08:00'), [{ ...drink(1), id: 500, allergyAckAt: ackAt }], { allergens: ['soybeans'] });
    expect(needsAllergyAck(cardsOf([t(null)]).get(500)!)).toBe(true);
    expect(needsAllergyAck(cardsOf([t(at('08:01'))]).get(500)!)).toBe(false);
  });

  it('treats an empty allergy note as no allergy', () => {
    // Jugline's own rule (no outside value): a blank note says nothing.
    expect(hasAllergy({ allergens: [], allergyNote: '' })).toBe(false);
    expect(hasAllergy({ allergens: [], allergyNote: null })).toBe(false);
  });
});
