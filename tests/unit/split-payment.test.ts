// The pure rules of a split payment, each figure worked by hand beside it.
import { describe, expect, it } from 'vitest';
import { formatCents } from '@/domain/money';
import { paidColumns, partLines, refundPlan, remainderCents, splitDifference } from '@/domain/split-payment';

const money = (c: number) => formatCents(c, 'USD');
const part = (n: number, amountCents: number, refundedCents = 0) => ({ paymentId: 100 + n, part: n, amountCents, refundedCents });

describe('splitDifference and remainderCents', () => {
  it('says how far the parts are from the amount due', () => {
    // 5.00 + 8.15 = 13.15 due: 0; 5.00 + 8.00 = 13.00: 15 cents short
    expect(splitDifference([{ amountCents: 500 }, { amountCents: 815 }], 1315)).toBe(0);
    expect(splitDifference([{ amountCents: 500 }, { amountCents: 800 }], 1315)).toBe(-15);
    expect(splitDifference([{ amountCents: 500 }, { amountCents: 900 }], 1315)).toBe(85);
  });

  it('the last part is what the others leave, never below 0', () => {
    expect(remainderCents([{ amountCents: 500 }], 1315)).toBe(815);
    expect(remainderCents([{ amountCents: 500 }, { amountCents: 300 }], 1315)).toBe(515);
    expect(remainderCents([{ amountCents: 2000 }], 1315)).toBe(0);
  });
});

describe('paidColumns', () => {
  it('an order paid at once keeps its method and its cash figures', () => {
    expect(paidColumns([{ method: 'cash', amountCents: 1315, tenderedCents: 2000, changeCents: 685 }])).toEqual({
      payment_method: 'cash',
      tendered_cents: 2000,
      change_cents: 685,
      split_cash_cents: null,
    });
    expect(paidColumns([{ method: 'card', amountCents: 1315, tenderedCents: null, changeCents: null }])).toMatchObject({
      payment_method: 'card',
      tendered_cents: null,
      change_cents: null,
    });
  });

  it('a split adds up its cash parts: tendered 10.00 + 5.00, change 5.00 + 0.00, cash 5.00 + 5.00', () => {
    expect(
      paidColumns([
        { method: 'cash', amountCents: 500, tenderedCents: 1000, changeCents: 500 },
        { method: 'cash', amountCents: 500, tenderedCents: 500, changeCents: 0 },
        { method: 'card', amountCents: 315, tenderedCents: null, changeCents: null },
      ]),
    ).toEqual({ payment_method: 'split', tendered_cents: 1500, change_cents: 500, split_cash_cents: 1000 });
  });

  it('two cards: no cash figures, no cash', () => {
    expect(
      paidColumns([
        { method: 'card', amountCents: 700, tenderedCents: null, changeCents: null },
        { method: 'card', amountCents: 615, tenderedCents: null, changeCents: null },
      ]),
    ).toEqual({ payment_method: 'split', tendered_cents: null, change_cents: null, split_cash_cents: 0 });
  });
});

describe('refundPlan', () => {
  it('gives back the last part first, each at most what is left of it', () => {
    // parts 5.00 cash, 8.15 card: 10.00 back = 8.15 from part 2, then 1.85 from part 1
    expect(refundPlan([part(1, 500), part(2, 815)], 1000)).toEqual([
      { paymentId: 102, amountCents: 815 },
      { paymentId: 101, amountCents: 185 },
    ]);
    // part 2 has 3.00 back already: 6.00 back = 5.15 from part 2, 0.85 from part 1
    expect(refundPlan([part(1, 500), part(2, 815, 300)], 600)).toEqual([
      { paymentId: 102, amountCents: 515 },
      { paymentId: 101, amountCents: 85 },
    ]);
    // a part given back in full is passed over
    expect(refundPlan([part(1, 500), part(2, 815, 815)], 200)).toEqual([{ paymentId: 101, amountCents: 200 }]);
  });

  it('refuses more than the parts hold', () => {
    expect(() => refundPlan([part(1, 500), part(2, 815, 15)], 1301)).toThrow(RangeError);
  });
});

describe('partLines', () => {
  it('says each part, with the cash tendered and the change', () => {
    expect(
      partLines(
        [
          { part: 1, method: 'cash', amountCents: 500, tenderedCents: 1000, changeCents: 500 },
          { part: 2, method: 'card', amountCents: 815, tenderedCents: null, changeCents: null },
        ],
        money,
      ),
    ).toEqual(['Part 1 · cash $5.00 (tendered $10.00, change $5.00)', 'Part 2 · card $8.15']);
  });
});
