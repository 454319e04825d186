// The Bar's keyboard as a barista uses it: number keys bump the card showing that number, arrows
// move the focus ring, Enter bumps the focused card, S starts it, A reads its allergy, R recalls the
// last bump. A bump key on a card with an unread allergy only moves the focus there. Keys typed in
// a text field are the field's. (A numbered bump bar is common practice; the rest is Jugline's own.)
import { renderHook } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { useState } from 'react';
import { describe, expect, it } from 'vitest';
import type { LaneDrink } from '@/domain/lanes';
import type { BarCommand } from '@/features/bar/commands';
import { useBumpKeys } from '@/features/bar/use-bump-keys';

function card(id: number, o: Partial<LaneDrink> = {}): LaneDrink {
  return {
    id,
    ticketId: id,
    itemName: 'Latte',
    sizeName: 'Regular',
    volumeMl: 355,
    milk: null,
    shots: 2,
    milkMl: 0,
    texture: null,
    extras: [],
    note: null,
    contains: [],
    doseDg: 190,
    status: 'queued',
    startedAt: null,
    doneAt: null,
    allergyAckAt: null,
    allergyAckBy: null,
    ticketNumber: id,
    customerName: `Guest ${id}`,
    firedAt: '2026-03-02T14:00:00.000Z',
    rushedAt: null,
    service: 'takeaway',
    allergens: [],
    allergyNote: null,
    indexInTicket: 1,
    ticketSize: 1,
    ...o,
  };
}

/** The hook on a screen with these cards and keys; returns what it ran and where the focus is. */
function bar(cards: LaneDrink[], keys: [number, number][], recallLast: number | null = null) {
  const ran: BarCommand[] = [];
  const view = renderHook(() => {
    const [focusId, setFocusId] = useState<number | null>(null);
    useBumpKeys({ cards, keys: new Map(keys), focusId, setFocusId, run: (c) => ran.push(c), recallLast });
    return focusId;
  });
  return { ran, focus: () => view.result.current };
}

describe('the Bar keys', () => {
  it('a number bumps the card that shows it, not the card in that place', async () => {
    // card 12 shows key 1 although it sits second: keys stay with their card
    const screen = bar(
      [card(11), card(12), card(13)],
      [
        [12, 1],
        [11, 2],
        [13, 3],
      ],
    );
    await userEvent.keyboard('1');
    expect(screen.ran).toEqual([{ kind: 'bump-drink', id: 12 }]);
    await userEvent.keyboard('9'); // no card shows 9: nothing happens
    expect(screen.ran).toHaveLength(1);
  });

  it('arrows move the focus ring; Enter bumps and S starts the focused card', async () => {
    const screen = bar(
      [card(1), card(2), card(3)],
      [
        [1, 1],
        [2, 2],
        [3, 3],
      ],
    );
    await userEvent.keyboard('{ArrowDown}{ArrowDown}');
    expect(screen.focus()).toBe(2);
    await userEvent.keyboard('{ArrowUp}');
    expect(screen.focus()).toBe(1);
    await userEvent.keyboard('s{Enter}');
    expect(screen.ran).toEqual([
      { kind: 'start-drink', id: 1 },
      { kind: 'bump-drink', id: 1 },
    ]);
  });

  it('a bump key on an unread allergy only focuses the card; A reads it, then the key bumps', async () => {
    const nuts = card(5, { allergens: ['peanuts'] });
    const first = bar(
      [card(4), nuts],
      [
        [4, 1],
        [5, 2],
      ],
    );
    await userEvent.keyboard('2');
    expect(first.ran).toEqual([]);
    expect(first.focus()).toBe(5);
    await userEvent.keyboard('a');
    expect(first.ran).toEqual([{ kind: 'acknowledge-allergy', id: 5 }]);

    const read = bar(
      [card(4), { ...nuts, allergyAckAt: '2026-03-02T14:01:00.000Z', allergyAckBy: 'Theo' }],
      [
        [4, 1],
        [5, 2],
      ],
    );
    await userEvent.keyboard('2');
    expect(read.ran).toEqual([{ kind: 'bump-drink', id: 5 }]);
  });

  it('R recalls the last bumped ticket, and nothing when there is none', async () => {
    const none = bar([card(1)], [[1, 1]]);
    await userEvent.keyboard('r');
    expect(none.ran).toEqual([]);
    const some = bar([card(1)], [[1, 1]], 77);
    await userEvent.keyboard('R');
    expect(some.ran).toContainEqual({ kind: 'recall-ticket', id: 77 });
  });

  it('keys typed into a text field stay in the field', async () => {
    const screen = bar([card(1)], [[1, 1]]);
    const field = document.createElement('input');
    document.body.append(field);
    field.focus();
    await userEvent.keyboard('1s{Enter}');
    expect(screen.ran).toEqual([]);
    expect(field.value).toBe('1s');
    field.remove();
  });
});
