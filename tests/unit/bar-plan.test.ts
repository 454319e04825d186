import { describe, it, expect } from 'vitest';
import type { Pitcher } from '../../src/domain/jug-plan';
import { groupIntoLanes, hasAllergy, needsAllergyAck, planBar } from '../../src/domain/lanes';
import type { DrinkStatus, DrinkView, MilkRef, Texture, TicketView } from '../../src/domain/types';

const OAT: MilkRef = { id: 7, name: 'Oat', code: 'OT' };
const WHOLE: MilkRef = { id: 3, name: 'Whole', code: 'WM' };

// Invented pitchers (not the demo café's). Fill lines below capacity: common practice is to fill
// a milk pitcher to just below the base of the spout (check-values.md); the numbers are invented.
const SMALL: Pitcher = { capacityMl: 300, fillLineMl: 160 };
const MEDIUM: Pitcher = { capacityMl: 500, fillLineMl: 280 };
const LARGE: Pitcher = { capacityMl: 1000, fillLineMl: 560 };
const PITCHERS = [SMALL, MEDIUM, LARGE];
const WASTE = 20;

// Doses in tenths of a gram. Double: 19 g = 190 dg, inside the common-practice 18–22 g for a
// double shot (check-values.md, no published source). Single: 7 g = 70 dg, the Istituto Nazionale
// Espresso Italiano's 7 ± 0.5 g per single (check-values.md, confirmed).
const DOUBLE_DG = 190;
const SINGLE_DG = 70;

interface DrinkOpts {
  milk?: MilkRef | null;
  shots?: 1 | 2;
  milkMl?: number;
  texture?: Texture | null;
  status?: DrinkStatus;
  allergyAckAt?: string | null;
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
    modifiers: [],
    note: null,
    contains: [],
    doseDg: shots === 2 ? DOUBLE_DG : SINGLE_DG,
    status: o.status ?? 'queued',
    startedAt: o.status === 'making' ? '2025-03-01T08:20:00.000Z' : null,
    doneAt: null,
    allergyAckAt: o.allergyAckAt ?? null,
    allergyAckBy: o.allergyAckAt ? 'Sam' : null,
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
      [
        ticket(1, at('08:00'), [flatWhite, longBlackMaking]),
        ticket(2, at('08:02'), [cappuccino, longBlack]),
        ticket(3, at('08:03'), [latte]),
      ],
      PITCHERS,
      WASTE,
    );

    // Oat and none tie at two drinks and at the oldest ticket (08:00); 'milk:7' < 'none'.
    expect(lanes.map((l) => l.key)).toEqual(['milk:7', 'none', 'milk:3']);
    const [oat, none, whole] = lanes;

    // Oat: 150 + 180 + 20 waste = 350 ml; 350 > 280, ≤ 560 → 1000 ml pitcher, one batch.
    // Steam for foamy (the cappuccino); pour the flat white first, then the cappuccino.
    expect(oat.jugPlan).toEqual([{ pitcher: LARGE, coldMl: 350, steamFor: 'foamy', drinkIds: [flatWhite.id, cappuccino.id] }]);
    // Two queued doubles: 4 shots, 2 × 190 = 380 dg.
    expect(oat.shotPlan).toEqual({ shots: 4, doseDg: 380 });

    // No milk: no jug. Only the queued long black counts; the one being made is already pulled.
    expect(none.jugPlan).toEqual([]);
    expect(none.drinkCount).toBe(2);
    expect(none.shotPlan).toEqual({ shots: 2, doseDg: 190 });

    // Whole: 200 + 20 = 220 ml; 220 > 160, ≤ 280 → 500 ml pitcher. One single: 1 shot, 70 dg.
    expect(whole.jugPlan).toEqual([{ pitcher: MEDIUM, coldMl: 220, steamFor: 'silky', drinkIds: [latte.id] }]);
    expect(whole.shotPlan).toEqual({ shots: 1, doseDg: 70 });

    // Totals: 4 + 2 + 1 = 7 shots; 380 + 190 + 70 = 640 dg.
    expect(shotPlan).toEqual({ shots: 7, doseDg: 640 });
    expect(shotPlan.shots).toBe(lanes.reduce((n, l) => n + l.shotPlan.shots, 0));
    expect(shotPlan.doseDg).toBe(lanes.reduce((n, l) => n + l.shotPlan.doseDg, 0));
  });

  it('keeps lanes as groupIntoLanes makes them', () => {
    const tickets = [
      ticket(1, at('08:00'), [drink(1, { milk: OAT, shots: 1 }), drink(1, { milk: WHOLE })]),
      ticket(2, at('08:04'), [drink(2, { milk: OAT })]),
    ];
    const { lanes } = planBar(tickets, PITCHERS, WASTE);
    // The planned lanes are the grouped lanes plus their plans.
    expect(lanes.map(({ jugPlan: _j, shotPlan: _s, ...lane }) => lane)).toEqual(groupIntoLanes(tickets));
  });

  it("counts no shots or dose for drinks already being made or done", () => {
    const { lanes, shotPlan } = planBar(
      [ticket(1, at('08:00'), [drink(1, { status: 'making' }), drink(1, { status: 'done' })])],
      PITCHERS,
      WASTE,
    );
    expect(lanes).toHaveLength(1);
    expect(lanes[0].shotPlan).toEqual({ shots: 0, doseDg: 0 });
    expect(shotPlan).toEqual({ shots: 0, doseDg: 0 });
  });

  it('puts a rushed ticket first in its group and at the head of the jug plan, though newer', () => {
    const old1 = drink(1, { milkMl: 200 });
    const old2 = drink(2, { milkMl: 200 });
    const rushed = drink(3, { milkMl: 200 });
    const { lanes } = planBar(
      [
        ticket(1, at('08:00'), [old1]),
        ticket(2, at('08:05'), [old2]),
        ticket(3, at('08:10'), [rushed], { rushedAt: at('08:12') }),
      ],
      PITCHERS,
      WASTE,
    );
    expect(lanes).toHaveLength(1);
    // Lane order: rushed (08:10, rushed 08:12), then 08:00, then 08:05.
    expect(lanes[0].groups[0].drinks.map((c) => c.ticketId)).toEqual([3, 1, 2]);
    // Batch 1: 200 + 200 + 20 = 420 ≤ 560; adding the third → 620 > 560, close. 420 > 280 → 1000 ml.
    //   All flat, so they pour in lane order: the rushed drink first.
    // Batch 2: 200 + 20 = 220 ≤ 280 → 500 ml.
    expect(lanes[0].jugPlan).toEqual([
      { pitcher: LARGE, coldMl: 420, steamFor: 'flat', drinkIds: [rushed.id, old1.id] },
      { pitcher: MEDIUM, coldMl: 220, steamFor: 'flat', drinkIds: [old2.id] },
    ]);
  });

  it('plans jugs over the whole lane in lane order, across shot groups', () => {
    // The lane's groups list singles before doubles, but the jug plan runs over the whole lane
    // in lane order: the rushed double leads, though its group comes after the singles'.
    const oldSingle = drink(1, { shots: 1, milkMl: 100 });
    const rushedDouble = drink(2, { shots: 2, milkMl: 100 });
    const { lanes } = planBar(
      [ticket(1, at('08:00'), [oldSingle]), ticket(2, at('08:09'), [rushedDouble], { rushedAt: at('08:10') })],
      PITCHERS,
      // No waste: 100 + 100 = 200 ≤ 280 (> 160) → 500 ml; both flat, pour in lane order.
      0,
    );
    expect(lanes[0].groups.map((g) => g.drinks.map((c) => c.id))).toEqual([[oldSingle.id], [rushedDouble.id]]);
    expect(lanes[0].jugPlan).toEqual([{ pitcher: MEDIUM, coldMl: 200, steamFor: 'flat', drinkIds: [rushedDouble.id, oldSingle.id] }]);
  });

  it('without a rush, leads the jug plan with the oldest ticket even when its group comes later', () => {
    // Oldest is a double (08:00), newer is a single (08:04): groups list the single first.
    // Batch: 150 + 150 + 20 = 320 > 280, ≤ 560 → 1000 ml; pour oldest first.
    const oldDouble = drink(1, { shots: 2 });
    const newSingle = drink(2, { shots: 1 });
    const { lanes } = planBar([ticket(2, at('08:04'), [newSingle]), ticket(1, at('08:00'), [oldDouble])], PITCHERS, WASTE);
    expect(lanes[0].jugPlan).toEqual([{ pitcher: LARGE, coldMl: 320, steamFor: 'flat', drinkIds: [oldDouble.id, newSingle.id] }]);
  });
});

describe('needsAllergyAck', () => {
  const cardsOf = (tickets: TicketView[]) =>
    new Map(groupIntoLanes(tickets).flatMap((l) => l.groups.flatMap((g) => g.drinks)).map((c) => [c.id, c]));

  it("is true for a drink of a ticket with allergens or an allergy note until it's acknowledged", () => {
    // Almond milk is a tree nut under both the US and the EU lists (check-values.md).
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
    const t = (ackAt: string | null) => ticket(1, at('08:00'), [{ ...drink(1), id: 500, allergyAckAt: ackAt }], { allergens: ['soybeans'] });
    expect(needsAllergyAck(cardsOf([t(null)]).get(500)!)).toBe(true);
    expect(needsAllergyAck(cardsOf([t(at('08:01'))]).get(500)!)).toBe(false);
  });

  it('treats an empty allergy note as no allergy', () => {
    expect(hasAllergy({ allergens: [], allergyNote: '' })).toBe(false);
    expect(hasAllergy({ allergens: [], allergyNote: null })).toBe(false);
  });
});
