// A drink's own money back and the waste remakes cost (src/domain/remakes.ts). Amounts worked by
// hand; the tax rule is money.ts's (half-up rounding per invoice, SSUTA §324).
import { describe, expect, it } from 'vitest';
import { orderTotals } from '@/domain/money';
import { drinkRefundCents, REMAKE_REASONS, remakeWaste, soldLines } from '@/domain/remakes';

const EXCLUSIVE = { taxRateMilliPct: 8250, taxMode: 'exclusive' as const };

describe('drinkRefundCents', () => {
  it("is the drink's price plus its share of the tax: $4.60 at 8.25 % added on top", () => {
    // lines 460 + 320 + 395 = 1175; tax 96.94 → 97; total 1272 (by hand)
    const order = { subtotalCents: 1175, totalCents: 1272 };
    expect(orderTotals([460, 320, 395], EXCLUSIVE).totalCents).toBe(1272);
    // 1272 − round(1272 × 715 / 1175 = 774.03) = 498; 4.60 × 1.0825 = 4.9795
    expect(drinkRefundCents(order, 1175, 460)).toBe(498);
    // then 320 of the 715 still standing: 774 − round(1272 × 395 / 1175 = 427.6) = 346
    expect(drinkRefundCents(order, 715, 320)).toBe(346);
    // the last line gets what is left: 428
    expect(drinkRefundCents(order, 395, 395)).toBe(428);
  });

  it('takes its share of a discount: 10 % off 2 × $4.60 with tax inside the price', () => {
    // subtotal 920, discount 92, total 828 (tax inside): each drink 414
    const order = { subtotalCents: 920, totalCents: 828 };
    expect(drinkRefundCents(order, 920, 460)).toBe(414);
    expect(drinkRefundCents(order, 460, 460)).toBe(414);
  });

  it('gives back exactly the total, cent for cent, whichever order the drinks are refunded in', () => {
    const prices = [333, 333, 334, 125, 480];
    const total = orderTotals(prices, EXCLUSIVE, 77).totalCents;
    const order = { subtotalCents: prices.reduce((a, b) => a + b, 0), totalCents: total };
    for (const turn of [
      [0, 1, 2, 3, 4],
      [4, 3, 2, 1, 0],
      [2, 0, 4, 1, 3],
    ]) {
      let standing = order.subtotalCents;
      let back = 0;
      for (const i of turn) {
        back += drinkRefundCents(order, standing, prices[i]);
        standing -= prices[i];
      }
      expect(back).toBe(total);
    }
  });

  it('is nothing for a drink at no charge (a remake) or an order with no subtotal', () => {
    expect(drinkRefundCents({ subtotalCents: 920, totalCents: 996 }, 920, 0)).toBe(0);
    expect(drinkRefundCents({ subtotalCents: 0, totalCents: 0 }, 0, 0)).toBe(0);
  });
});

describe('remakeWaste', () => {
  it('sums rows per reason, in the list order, leaving out reasons with none', () => {
    const w = remakeWaste([
      { reason: 'spilled', count: 1, doseDg: 180, milkMl: 120 },
      { reason: 'made_wrong', count: 2, doseDg: 360, milkMl: 240 },
      { reason: 'spilled', count: 1, doseDg: 90, milkMl: 0 },
      { reason: 'other', count: 0, doseDg: 0, milkMl: 0 },
    ]);
    expect(w).toEqual({
      count: 4,
      doseDg: 630,
      milkMl: 360,
      byReason: [
        { reason: 'made_wrong', count: 2, doseDg: 360, milkMl: 240 },
        { reason: 'spilled', count: 2, doseDg: 270, milkMl: 120 },
      ],
    });
    expect(REMAKE_REASONS[0]).toBe('made_wrong');
  });
});

describe('soldLines', () => {
  it('leaves out remakes: the receipt lists the drink the customer bought once', () => {
    const lines = [
      { id: 1, remake: null },
      { id: 2, remake: null },
      { id: 3, remake: { of: 1, reason: 'spilled' as const, note: null } },
    ];
    expect(soldLines(lines).map((l) => l.id)).toEqual([1, 2]);
  });
});
