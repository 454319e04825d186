import { describe, it, expect } from 'vitest';
import { applyPickupEvent, pickupEvent, pickupTicket, pickupView } from '@/domain/pickup';
import { applyEvent, firstName, openTickets, pickupBoard, ticketAgeSeconds } from '@/domain/tickets';
import type { BoardSnapshot, DrinkView, LiveEvent, TicketStatus, TicketView } from '@/domain/types';

const aDrink: DrinkView = {
  id: 1,
  ticketId: 1,
  itemName: 'Cortado',
  sizeName: null,
  volumeMl: 120,
  milk: { id: 2, name: 'Whole', code: 'WM' },
  shots: 2,
  milkMl: 60,
  texture: 'flat',
  extras: [],
  note: null,
  contains: [],
  doseDg: 190,
  status: 'queued',
  startedAt: null,
  doneAt: null,
  allergyAckAt: null,
  allergyAckBy: null,
};

function ticket(id: number, firedAt: string, status: TicketStatus = 'open', readyAt: string | null = null): TicketView {
  return {
    id,
    number: 40 + id,
    customerName: 'Wren Abernathy',
    status,
    firedAt,
    readyAt,
    collectedAt: null,
    service: 'takeaway',
    allergens: [],
    allergyNote: null,
    rushedAt: null,
    drinks: [{ ...aDrink, ticketId: id }],
  };
}

function board(seq: number, tickets: TicketView[]): BoardSnapshot {
  return {
    seq,
    now: '2025-04-02T10:00:00.000Z',
    location: {
      name: 'Test Café',
      waitTargetSeconds: 240,
      pickupTimeoutSeconds: 600,
      jugRules: { pitchers: [], wasteMl: 0, maxDrinks: 4, expansionPct: { flat: 15, silky: 25, foamy: 75 } },
    },
    tickets,
  };
}

function event(seq: number, t: TicketView, at = '2025-04-02T10:05:00.000Z'): LiveEvent {
  return { seq, type: 'order.fired', at, ticket: t };
}

describe('applyEvent', () => {
  it('ignores an event at or below the board sequence', () => {
    const b = board(10, [ticket(1, '2025-04-02T09:50:00.000Z')]);
    expect(applyEvent(b, event(10, ticket(2, '2025-04-02T09:55:00.000Z')), openTickets)).toBe(b);
    expect(applyEvent(b, event(3, ticket(2, '2025-04-02T09:55:00.000Z')), openTickets)).toBe(b);
  });

  it('adds a new ticket and moves the sequence on', () => {
    const b = board(10, [ticket(1, '2025-04-02T09:50:00.000Z')]);
    const next = applyEvent(b, event(11, ticket(2, '2025-04-02T09:55:00.000Z')), openTickets);
    expect(next.seq).toBe(11);
    expect(next.now).toBe('2025-04-02T10:05:00.000Z');
    expect(next.tickets.map((t) => t.id)).toEqual([1, 2]);
  });

  it('replaces a ticket it already holds rather than adding a copy', () => {
    const b = board(10, [ticket(1, '2025-04-02T09:50:00.000Z')]);
    const changed = { ...ticket(1, '2025-04-02T09:50:00.000Z'), drinks: [{ ...aDrink, status: 'making' as const }] };
    const next = applyEvent(b, event(11, changed), openTickets);
    expect(next.tickets).toHaveLength(1);
    expect(next.tickets[0].drinks[0].status).toBe('making');
  });

  it('drops a ticket that is no longer open from the bar board', () => {
    const b = board(10, [ticket(1, '2025-04-02T09:50:00.000Z'), ticket(2, '2025-04-02T09:52:00.000Z')]);
    const ready = ticket(1, '2025-04-02T09:50:00.000Z', 'ready', '2025-04-02T10:04:00.000Z');
    const next = applyEvent(b, event(11, ready), openTickets);
    expect(next.tickets.map((t) => t.id)).toEqual([2]);
  });

  it('keeps the tickets sorted by firedAt, oldest first', () => {
    const b = board(10, [ticket(1, '2025-04-02T09:40:00.000Z'), ticket(3, '2025-04-02T09:58:00.000Z')]);
    // A recalled ticket fired between the two lands in the middle.
    const next = applyEvent(b, { ...event(11, ticket(2, '2025-04-02T09:45:00.000Z')), type: 'ticket.recalled' }, openTickets);
    expect(next.tickets.map((t) => t.id)).toEqual([1, 2, 3]);
  });
});

describe('pickupBoard', () => {
  const keep = pickupBoard(120);
  const now = Date.parse('2025-04-02T10:05:00.000Z');

  it('keeps open tickets', () => {
    expect(keep(ticket(1, '2025-04-02T09:00:00.000Z'), now)).toBe(true);
  });

  it('keeps a ready ticket within the timeout and drops an older one', () => {
    // 60 s ready < 120 s timeout → shown
    expect(keep(ticket(1, '2025-04-02T10:00:00.000Z', 'ready', '2025-04-02T10:04:00.000Z'), now)).toBe(true);
    // 180 s ready ≥ 120 s → gone
    expect(keep(ticket(1, '2025-04-02T10:00:00.000Z', 'ready', '2025-04-02T10:02:00.000Z'), now)).toBe(false);
  });

  it('drops collected tickets', () => {
    expect(keep(ticket(1, '2025-04-02T10:00:00.000Z', 'collected', '2025-04-02T10:04:30.000Z'), now)).toBe(false);
  });

  it('is applied by applyEvent at the event time', () => {
    const ready = ticket(1, '2025-04-02T09:50:00.000Z', 'ready', '2025-04-02T10:04:00.000Z');
    const shown = applyEvent(board(1, []), event(2, ready, '2025-04-02T10:05:00.000Z'), keep);
    expect(shown.tickets.map((t) => t.id)).toEqual([1]);
    // Same ticket, but the event is stamped 5 minutes after it went ready (> 120 s).
    const gone = applyEvent(board(1, []), event(2, ready, '2025-04-02T10:09:00.000Z'), keep);
    expect(gone.tickets).toEqual([]);
  });
});

describe('ticketAgeSeconds', () => {
  it('counts whole seconds since firing and never goes negative', () => {
    // Hand-worked: 10:00:00 → 10:01:30.9 is 90.9 s → 90
    expect(ticketAgeSeconds('2025-04-02T10:00:00.000Z', Date.parse('2025-04-02T10:01:30.900Z'))).toBe(90);
    expect(ticketAgeSeconds('2025-04-02T10:00:00.000Z', Date.parse('2025-04-02T09:59:00.000Z'))).toBe(0);
  });
});

describe('firstName and the public pickup view', () => {
  it('keeps only the first name', () => {
    expect(firstName('Wren Abernathy')).toBe('Wren');
    expect(firstName('  Ode   van der Berg ')).toBe('Ode');
    expect(firstName('Solo')).toBe('Solo');
    expect(firstName('   ')).toBe('');
  });

  // The Pickup screen faces customers: first name, number, status and ready time (and the row id
  // that keys it), nothing else — common practice for a public order-status board.
  it('keeps only the first name, number, status and ready time of a ticket', () => {
    const t = {
      ...ticket(1, '2025-04-02T09:50:00.000Z', 'ready', '2025-04-02T10:04:00.000Z'),
      allergens: ['sesame'],
      allergyNote: 'Severe',
      takenBy: 'Priya Onslow',
    };
    expect(pickupTicket(t)).toEqual({ id: 1, number: 41, firstName: 'Wren', status: 'ready', readyAt: '2025-04-02T10:04:00.000Z' });
    // The original is left alone.
    expect(t.customerName).toBe('Wren Abernathy');
    expect(t.drinks).toHaveLength(1);
  });

  it('shapes a whole board: its place in the log, the café name and pickup timeout, the tickets in order of taking', () => {
    const v = pickupView(board(4, [ticket(2, '2025-04-02T09:50:00.000Z'), ticket(1, '2025-04-02T09:51:00.000Z')]));
    expect(v).toEqual({
      seq: 4,
      now: '2025-04-02T10:00:00.000Z',
      location: { name: 'Test Café', pickupTimeoutSeconds: 600 },
      tickets: [
        { id: 1, number: 41, firstName: 'Wren', status: 'open', readyAt: null },
        { id: 2, number: 42, firstName: 'Wren', status: 'open', readyAt: null },
      ],
    });
  });

  it('shapes events: a ticket event carries the Pickup ticket, any other only its place in the log', () => {
    expect(pickupEvent(event(7, ticket(3, '2025-04-02T09:50:00.000Z')))).toEqual({
      seq: 7,
      type: 'order.fired',
      at: '2025-04-02T10:05:00.000Z',
      ticket: { id: 3, number: 43, firstName: 'Wren', status: 'open', readyAt: null },
    });
    const shift = {
      seq: 8,
      type: 'shift.changed' as const,
      at: '2025-04-02T10:06:00.000Z',
      shift: {
        id: 1,
        openedAt: '',
        openedBy: 'Theo Brand',
        openingFloatCents: 150_00,
        baristasOnBar: 1,
        waitTargetSeconds: 240,
        closedAt: null,
        closedBy: null,
        expectedCashCents: null,
        countedCashCents: null,
        closeNote: null,
      },
    };
    expect(pickupEvent(shift)).toEqual({ seq: 8, type: 'shift.changed', at: '2025-04-02T10:06:00.000Z' });
  });

  it('applies Pickup events in order of taking, and not twice', () => {
    const b = pickupView(board(10, [ticket(1, '2025-04-02T09:50:00.000Z'), ticket(3, '2025-04-02T09:40:00.000Z')]));
    const e = pickupEvent(event(11, ticket(2, '2025-04-02T09:30:00.000Z'))) as Parameters<typeof applyPickupEvent>[1];
    const next = applyPickupEvent(b, e, pickupBoard(600));
    expect(next.tickets.map((t) => t.id)).toEqual([1, 2, 3]);
    expect(next.seq).toBe(11);
    expect(applyPickupEvent(next, e, pickupBoard(600))).toBe(next);
  });
});
