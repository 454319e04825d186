// Tips: the amount a suggested percentage gives, the bound on a tip, and how a refund splits
// between the order and the tip. Every figure worked out by hand beside its check.
import { describe, expect, it } from 'vitest';
import { amountDueCents, maxTipCents, refundSplit, tipForPercent } from '@/domain/tips';

describe('tipForPercent', () => {
  // Suggested tips of 10/15/20 % on the amount the customer sees, rounded half up to the cent:
  // common practice at counter-service card readers (from memory).
  it('takes the percentage of the total, half up to the cent', () => {
    expect(tipForPercent(1000, 15)).toBe(150); // 15 % of $10.00 = $1.50 exactly
    expect(tipForPercent(1315, 15)).toBe(197); // 15 % of $13.15 = $1.9725 → $1.97
    expect(tipForPercent(450, 15)).toBe(68); // 15 % of $4.50 = $0.675 → half up → $0.68
    expect(tipForPercent(1330, 18)).toBe(239); // 18 % of $13.30 = $2.394 → $2.39
    expect(tipForPercent(433, 10)).toBe(43); // 10 % of $4.33 = $0.433 → $0.43
    expect(tipForPercent(435, 10)).toBe(44); // 10 % of $4.35 = $0.435 → half up → $0.44 (a float would give 0.43499…)
    expect(tipForPercent(0, 20)).toBe(0);
  });

  it('on a tax-exclusive order: the total with tax, after the discount', () => {
    // $5.00 of lines, 10 % off → $4.50; 8.25 % tax on $4.50 = $0.37125 → $0.37; total $4.87
    // 20 % of $4.87 = $0.974 → $0.97; the customer pays $4.87 + $0.97 = $5.84
    const tip = tipForPercent(487, 20);
    expect(tip).toBe(97);
    expect(amountDueCents(487, tip)).toBe(584);
  });
});

describe('maxTipCents', () => {
  it('is the order total, or $20.00 on a smaller order', () => {
    expect(maxTipCents(5_00)).toBe(20_00);
    expect(maxTipCents(64_10)).toBe(64_10);
  });
});

describe('refundSplit', () => {
  // total $10.00 with a $1.50 tip: $11.50 was paid
  it('gives the order’s money back first, the tip only past the total', () => {
    expect(refundSplit(1000, 300)).toEqual({ orderCents: 300, tipCents: 0 });
    expect(refundSplit(1000, 1000)).toEqual({ orderCents: 1000, tipCents: 0 });
    expect(refundSplit(1000, 1150)).toEqual({ orderCents: 1000, tipCents: 150 });
    expect(refundSplit(1000, 0)).toEqual({ orderCents: 0, tipCents: 0 });
  });
});
