import { describe, it, expect } from 'vitest';
import { groupIntoLanes } from '@/domain/lanes';
import type { DrinkStatus, DrinkView, MilkRef, TicketView } from '@/domain/types';

// Sources: how a bar groups and orders its drinks is common practice (no published source):
// drinks sharing a milk are steamed together, first fired is first made, a lead can move a ticket
// to the front. Checks of Jugline's own shapes (lane keys, card fields) say so: no outside value.
// Ticket times are invented.

// `sort` is the milk's place in the café's menu: Whole is listed before Oat.
const OAT: MilkRef = { id: 7, name: 'Oat', code: 'OT', sort: 2 };
const WHOLE: MilkRef = { id: 3, name: 'Whole', code: 'WM', sort: 0 };
const SOY: MilkRef = { id: 9, name: 'Soy', code: 'SY', sort: 3 };

let nextDrinkId = 1;
function drink(ticketId: number, milk: MilkRef | null, shots: number, status: DrinkStatus = 'queued'): DrinkView {
  return {
    id: nextDrinkId++,
    ticketId,
    itemName: milk ? 'Flat white' : 'Long black',
    sizeName: null,
    volumeMl: null,
    milk,
    shots,
    milkMl: milk ? 150 : 0,
    texture: milk ? 'flat' : null,
    extras: [],
    note: null,
    contains: [],
    doseDg: shots * 95,
    status,
    startedAt: null,
    doneAt: null,
    allergyAckAt: null,
    allergyAckBy: null,
  };
}

function ticket(id: number, firedAt: string, drinks: DrinkView[]): TicketView {
  return {
    id,
    number: 100 + id,
    customerName: `Guest ${id}`,
    status: 'open',
    firedAt,
    readyAt: null,
    collectedAt: null,
    service: 'takeaway',
    allergens: [],
    allergyNote: null,
    rushedAt: null,
    drinks,
  };
}

describe('groupIntoLanes', () => {
  it('puts drinks sharing a milk in one lane, oldest first whatever their shot count', () => {
    // Common practice: drinks sharing a milk are steamed together, so they share one lane;
    // first fired, first made: the shot count is a mark on the card, not a section that reorders.
    const lanes = groupIntoLanes([
      ticket(1, '2025-03-01T08:00:00.000Z', [drink(1, OAT, 2), drink(1, OAT, 1)]),
      ticket(2, '2025-03-01T08:01:00.000Z', [drink(2, OAT, 2)]),
    ]);
    expect(lanes).toHaveLength(1);
    expect(lanes[0].key).toBe('milk:7');
    expect(lanes[0].milk).toEqual(OAT);
    expect(lanes[0].drinkCount).toBe(3);
    expect(lanes[0].drinks.map((d) => [d.ticketId, d.shots])).toEqual([
      [1, 2],
      [1, 1],
      [2, 2],
    ]);
  });

  it("keys the no-milk lane 'none'", () => {
    // Jugline's own key (no outside value); drinks without milk share a lane (common practice).
    const lanes = groupIntoLanes([ticket(1, '2025-03-01T08:00:00.000Z', [drink(1, null, 2)])]);
    expect(lanes.map((l) => l.key)).toEqual(['none']);
    expect(lanes[0].milk).toBeNull();
  });

  it('leaves out drinks that are done', () => {
    // Common practice: a bumped drink has left the bar.
    const lanes = groupIntoLanes([
      ticket(1, '2025-03-01T08:00:00.000Z', [drink(1, OAT, 2, 'done'), drink(1, WHOLE, 2, 'making')]),
      ticket(2, '2025-03-01T08:02:00.000Z', [drink(2, OAT, 1, 'done')]),
    ]);
    // The oat lane had only done drinks, so it is gone.
    expect(lanes.map((l) => l.key)).toEqual(['milk:3']);
    expect(lanes[0].drinkCount).toBe(1);
  });

  it('orders drinks oldest ticket first inside a lane, whatever the input order', () => {
    // Common practice: first fired, first made.
    const lanes = groupIntoLanes([
      ticket(5, '2025-03-01T08:09:00.000Z', [drink(5, WHOLE, 2)]),
      ticket(4, '2025-03-01T08:03:00.000Z', [drink(4, WHOLE, 2)]),
      ticket(6, '2025-03-01T08:06:00.000Z', [drink(6, WHOLE, 2)]),
    ]);
    expect(lanes[0].drinks.map((d) => d.ticketId)).toEqual([4, 6, 5]); // first fired, first made
    expect(lanes[0].oldestFiredAt).toBe('2025-03-01T08:03:00.000Z');
  });

  it("keeps the lanes in the menu's milk order, the no-milk lane last, however many drinks each holds", () => {
    // Jugline's own layout rule (no outside value): a lane stays where the baristas last saw it,
    // so bumps never make lanes swap places.
    const lanes = groupIntoLanes([
      // Whole: one drink, oldest ticket of all.
      ticket(1, '2025-03-01T08:00:00.000Z', [drink(1, WHOLE, 2)]),
      // Oat: three drinks, newer.
      ticket(2, '2025-03-01T08:05:00.000Z', [drink(2, OAT, 2), drink(2, OAT, 2), drink(2, OAT, 1)]),
      // No milk: one drink, fired between the other two.
      ticket(3, '2025-03-01T08:02:00.000Z', [drink(3, null, 2)]),
    ]);
    // Whole comes before Oat in the menu, though Oat has more drinks; no milk goes last.
    expect(lanes.map((l) => l.key)).toEqual(['milk:3', 'milk:7', 'none']);
    // Bumping Oat down to one drink moves nothing.
    const fewer = groupIntoLanes([
      ticket(1, '2025-03-01T08:00:00.000Z', [drink(1, WHOLE, 2)]),
      ticket(2, '2025-03-01T08:05:00.000Z', [drink(2, OAT, 1)]),
      ticket(3, '2025-03-01T08:02:00.000Z', [drink(3, null, 2)]),
      ticket(4, '2025-03-01T08:09:00.000Z', [drink(4, SOY, 2), drink(4, WHOLE, 2), drink(4, WHOLE, 2)]),
    ]);
    expect(fewer.map((l) => l.key)).toEqual(['milk:3', 'milk:7', 'milk:9', 'none']);
  });

  it("gives each card its place among the ticket's drinks and the ticket's size", () => {
    // Jugline's own card fields (no outside value): "2 of 3" on a card, copied from its ticket.
    const t = ticket(9, '2025-03-01T08:00:00.000Z', [drink(9, WHOLE, 2), drink(9, null, 2), drink(9, WHOLE, 1)]);
    const lanes = groupIntoLanes([t]);
    const cards = lanes.flatMap((l) => l.drinks);
    const byId = new Map(cards.map((c) => [c.id, c]));
    t.drinks.forEach((d, i) => {
      const card = byId.get(d.id)!;
      expect(card.indexInTicket).toBe(i + 1);
      expect(card.ticketSize).toBe(3);
      expect(card.ticketNumber).toBe(109);
      expect(card.customerName).toBe('Guest 9');
      expect(card.firedAt).toBe('2025-03-01T08:00:00.000Z');
    });
  });

  it('puts rushed tickets first, in the order they were rushed, then the rest oldest first', () => {
    // A lead moves a ticket to the front of the bar; two rushes keep the order they were made in.
    const lanes = groupIntoLanes([
      ticket(1, '2025-03-01T08:00:00.000Z', [drink(1, WHOLE, 2)]),
      ticket(2, '2025-03-01T08:02:00.000Z', [drink(2, WHOLE, 2)]),
      { ...ticket(3, '2025-03-01T08:04:00.000Z', [drink(3, WHOLE, 2)]), rushedAt: '2025-03-01T08:07:00.000Z' },
      { ...ticket(4, '2025-03-01T08:05:00.000Z', [drink(4, WHOLE, 2)]), rushedAt: '2025-03-01T08:06:00.000Z' },
    ]);
    // Ticket 4 was rushed first (08:06), then ticket 3 (08:07); then 1 and 2 by age.
    expect(lanes[0].drinks.map((d) => d.ticketId)).toEqual([4, 3, 1, 2]);
    expect(lanes[0].drinks[0].rushedAt).toBe('2025-03-01T08:06:00.000Z');
  });

  it("carries the ticket's allergy onto each card", () => {
    // Jugline's own card fields (no outside value); peanuts are a US major allergen (FALCPA,
    // docs/check-values.md).
    const t = { ...ticket(1, '2025-03-01T08:00:00.000Z', [drink(1, OAT, 2)]), allergens: ['peanuts'], allergyNote: 'EpiPen on file' };
    const [card] = groupIntoLanes([t])[0].drinks;
    expect(card.allergens).toEqual(['peanuts']);
    expect(card.allergyNote).toBe('EpiPen on file');
  });

  it("keeps a lane's oldest ticket time when a newer ticket in it is rushed", () => {
    // A rush moves a ticket to the front (common practice) but does not make the lane younger
    // (Jugline's own tie-break, no outside value).
    const lanes = groupIntoLanes([
      // Oat: a ticket from 08:00 and a newer one (08:09) rushed to the front at 08:10.
      ticket(1, '2025-03-01T08:00:00.000Z', [drink(1, OAT, 2)]),
      { ...ticket(2, '2025-03-01T08:09:00.000Z', [drink(2, OAT, 2)]), rushedAt: '2025-03-01T08:10:00.000Z' },
      // Whole: two drinks on one ticket from 08:05.
      ticket(3, '2025-03-01T08:05:00.000Z', [drink(3, WHOLE, 2), drink(3, WHOLE, 2)]),
    ]);
    // The rushed card leads the oat lane, but the lane's oldest ticket is still 08:00.
    const oat = lanes.find((l) => l.key === 'milk:7')!;
    expect(oat.drinks.map((d) => d.ticketId)).toEqual([2, 1]);
    expect(oat.oldestFiredAt).toBe('2025-03-01T08:00:00.000Z');
    // The lanes stay in menu order.
    expect(lanes.map((l) => l.key)).toEqual(['milk:3', 'milk:7']);
  });

  it('keeps a late ticket above newer ones, whatever their shots or drink (the morning rush)', () => {
    // Common practice: first fired, first made. The rush report: a new single-shot latte took the
    // top slot above a ticket 3 min late, and a ticket 16 min late sat under a newer chai.
    const latte1 = { ...drink(3, WHOLE, 1), itemName: 'Latte' };
    const chai = { ...drink(2, WHOLE, 0), itemName: 'Chai latte' };
    const lanes = groupIntoLanes([
      ticket(3, '2025-03-01T08:20:00.000Z', [latte1]),
      ticket(2, '2025-03-01T08:10:00.000Z', [chai]),
      ticket(1, '2025-03-01T08:01:00.000Z', [drink(1, WHOLE, 2)]),
    ]);
    expect(lanes[0].drinks.map((d) => d.ticketId)).toEqual([1, 2, 3]);
  });

  it("carries the ticket's Here / To go onto each card", () => {
    // Jugline's own card field (no outside value): a mug for here, a paper cup to go.
    const here = { ...ticket(1, '2025-03-01T08:00:00.000Z', [drink(1, OAT, 2)]), service: 'dine_in' as const };
    const away = ticket(2, '2025-03-01T08:01:00.000Z', [drink(2, OAT, 2)]);
    expect(groupIntoLanes([here, away])[0].drinks.map((d) => d.service)).toEqual(['dine_in', 'takeaway']);
  });

  it('returns no lanes for no open drinks', () => {
    // Jugline's own shape (no outside value).
    expect(groupIntoLanes([])).toEqual([]);
    expect(groupIntoLanes([ticket(1, '2025-03-01T08:00:00.000Z', [])])).toEqual([]);
  });
});
