import { describe, expect, it } from 'vitest';
import { assignBumpKeys } from '@/domain/bump-keys';

// Jugline's own keyboard rule (no outside value; a bump bar's numbered keys are common practice):
// keys 1–9 go only to cards on screen, and a card keeps its key while it stays on screen.
const keys = (m: Map<number, number>) => Object.fromEntries(m);

describe('assignBumpKeys', () => {
  it('numbers the cards on screen 1, 2, 3… in screen order', () => {
    expect(keys(assignBumpKeys(new Map(), [40, 41, 42]))).toEqual({ 40: 1, 41: 2, 42: 3 });
  });

  it('gives no key to a card that is not on screen, and at most nine keys', () => {
    const visible = Array.from({ length: 12 }, (_, i) => 100 + i);
    const got = assignBumpKeys(new Map(), visible);
    expect([...got.values()].sort((a, b) => a - b)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9]);
    expect(got.has(109)).toBe(false);
    expect(got.has(111)).toBe(false);
  });

  it('keeps every other card on its key after a bump; a card coming into view takes the freed key', () => {
    const before = assignBumpKeys(new Map(), [1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
    expect(before.get(3)).toBe(3);
    // card 3 is bumped: card 10 scrolls up into view
    const after = assignBumpKeys(before, [1, 2, 4, 5, 6, 7, 8, 9, 10]);
    expect(keys(after)).toEqual({ 1: 1, 2: 2, 4: 4, 5: 5, 6: 6, 7: 7, 8: 8, 9: 9, 10: 3 });
  });

  it('gives a newcomer the lowest free key, never one a card on screen holds', () => {
    const before = assignBumpKeys(new Map(), [7, 8]);
    const after = assignBumpKeys(before, [5, 7, 8]); // an older (rushed) card lands above them
    expect(keys(after)).toEqual({ 7: 1, 8: 2, 5: 3 });
  });

  it('forgets a card that left the screen: back on screen it takes a free key like any other', () => {
    const a = assignBumpKeys(new Map(), [1, 2]);
    const b = assignBumpKeys(a, [2]);
    expect(keys(b)).toEqual({ 2: 2 });
    expect(keys(assignBumpKeys(b, [1, 2]))).toEqual({ 1: 1, 2: 2 });
  });
});
