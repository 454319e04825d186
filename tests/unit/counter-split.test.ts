// The Counter's split form: what it sends, and why it can't send yet, worked by hand.
import { describe, expect, it } from 'vitest';
import { emptySplitPart, splitAmounts, splitParts, type SplitPartDraft } from '@/features/counter/checkout';
import { takesCard } from '@/features/counter/offline-orders';

const cash = (amount: string, tendered = ''): SplitPartDraft => ({ ...emptySplitPart('cash'), amount, tendered });
const card = (amount = '', paymentMethod: string | null = 'pm_card_visa'): SplitPartDraft => ({ ...emptySplitPart('card'), amount, paymentMethod });

describe('splitParts', () => {
  it('the last part is the rest: $5.20 due, $2.00 cash from $5.00, $3.20 on the card', () => {
    expect(splitParts([cash('2.00', '5'), card()], 520)).toEqual({
      parts: [
        { method: 'cash', amountCents: 200, tenderedCents: 500 },
        { method: 'card', amountCents: 320, paymentMethod: 'pm_card_visa' },
      ],
    });
    expect(splitAmounts([cash('2.00'), card('9.99')], 520)).toEqual([200, 320]); // the last part's typed amount is ignored
  });

  it('blank cash handed over is exact; three parts add up', () => {
    // $13.15 = 5.00 + 4.00 + 4.15
    expect(splitParts([cash('5'), card('4'), cash('')], 1315)).toEqual({
      parts: [
        { method: 'cash', amountCents: 500, tenderedCents: 500 },
        { method: 'card', amountCents: 400, paymentMethod: 'pm_card_visa' },
        { method: 'cash', amountCents: 415, tenderedCents: 415 },
      ],
    });
  });

  it('says what is missing, in the order a cashier fills it', () => {
    expect(splitParts([cash(''), card()], 520)).toEqual({ problem: 'Part 1: enter an amount like 5 or 5.50' });
    expect(splitParts([cash('0'), card()], 520)).toEqual({ problem: 'Part 1: more than 0, please' });
    expect(splitParts([cash('5.20'), card()], 520)).toEqual({ problem: 'The other parts already cover everything' });
    expect(splitParts([cash('2', 'lots'), card()], 520)).toEqual({ problem: 'Part 1: enter the cash like 10 or 10.50' });
    expect(splitParts([cash('2', '1.50'), card()], 520)).toEqual({ problem: 'Part 1: the cash is less than the part' });
    expect(splitParts([cash('2'), card('', null)], 520)).toEqual({ problem: 'Part 2: choose the card' });
  });
});

describe('takesCard', () => {
  it('holds a card order and a split with a card part; an all-cash split may go by itself', () => {
    expect(takesCard({ method: 'card', paymentMethod: 'pm_card_visa' })).toBe(true);
    expect(takesCard({ method: 'cash', tenderedCents: 500 })).toBe(false);
    const part = { method: 'cash' as const, amountCents: 100, tenderedCents: 100 };
    expect(takesCard({ method: 'split', parts: [part, { method: 'card', amountCents: 100, paymentMethod: 'pm_card_visa' }] })).toBe(true);
    expect(takesCard({ method: 'split', parts: [part, part] })).toBe(false);
  });
});
