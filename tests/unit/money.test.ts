import { describe, it, expect } from 'vitest';
import { divideHalfUp, formatCents, orderTotals, taxCents } from '@/domain/money';

// Rates are in thousandths of a percent: 7 % = 7000, 8.875 % = 8875, 20 % = 20000.

describe('divideHalfUp', () => {
  it('rounds an exact half up', () => {
    // Half-up rule (SSUTA §324: round up when the next digit is greater than four): 5/2 = 2.5 → 3
    expect(divideHalfUp(5, 2)).toBe(3);
    // 7/2 = 3.5 → 4 (half up, not half-to-even, which would also give 4; 5/2 above tells them apart)
    expect(divideHalfUp(7, 2)).toBe(4);
  });

  it('rounds below a half down and above a half up', () => {
    // Hand-worked: 4/3 = 1.33… → 1; 5/3 = 1.67… → 2; 10/5 = 2 exactly; 0/7 = 0
    expect(divideHalfUp(4, 3)).toBe(1);
    expect(divideHalfUp(5, 3)).toBe(2);
    expect(divideHalfUp(10, 5)).toBe(2);
    expect(divideHalfUp(0, 7)).toBe(0);
  });

  it('rejects a negative numerator and a non-positive denominator', () => {
    expect(() => divideHalfUp(-1, 2)).toThrow(RangeError);
    expect(() => divideHalfUp(1, 0)).toThrow(RangeError);
    expect(() => divideHalfUp(1, -3)).toThrow(RangeError);
  });
});

describe('taxCents, exclusive (tax added on top)', () => {
  it('matches the SSUTA §324 worked examples', () => {
    // SSUTA §324 Rounding Rule: $3.50 at 7 % → 0.245 → $0.25
    expect(taxCents(350, 7000, 'exclusive')).toBe(25);
    // SSUTA §324: $1.15 at 10 % → 0.115 → $0.12 (in floats 1.15 * 0.1 is 0.11499…, which would give 0.11)
    expect(taxCents(115, 10000, 'exclusive')).toBe(12);
    // SSUTA §324: $4.35 at 8.875 % → 0.3860625 → $0.39
    expect(taxCents(435, 8875, 'exclusive')).toBe(39);
  });

  it('keeps the cent when the third decimal is four or less', () => {
    // SSUTA §324 (round up only when the third decimal place is greater than four): $2.44 at 10 % → 0.244 → $0.24
    expect(taxCents(244, 10000, 'exclusive')).toBe(24);
  });

  it('rounds to the nearer penny, not always down', () => {
    // HMRC VAT Notice 700 §17.5–17.6 (retailers round VAT up or down to the nearer 1p, not down):
    // 338p at 20 % = 67.6p → 68p (rounding down would give 67p)
    expect(taxCents(338, 20000, 'exclusive')).toBe(68);
    // Same rule the other way: 332p at 20 % = 66.4p → 66p (not always up either)
    expect(taxCents(332, 20000, 'exclusive')).toBe(66);
  });
});

describe('taxCents, inclusive (tax part already inside the price)', () => {
  it('takes the tax fraction rate / (100 % + rate) of the price', () => {
    // Hand-worked: 100 × 1.07 = 107, so a 107-cent price at 7 % holds 7 cents of tax
    expect(taxCents(107, 7000, 'inclusive')).toBe(7);
    // Hand-worked: 1000 × 1.15 = 1150, so 1150 at 15 % holds 150
    expect(taxCents(1150, 15000, 'inclusive')).toBe(150);
  });

  it('rounds the tax part half up', () => {
    // Hand-worked: at 20 % the fraction is 20/120 = 1/6; 500/6 = 83.33… → 83
    expect(taxCents(500, 20000, 'inclusive')).toBe(83);
    // Hand-worked: 503/6 = 83.83… → 84
    expect(taxCents(503, 20000, 'inclusive')).toBe(84);
  });
});

describe('orderTotals', () => {
  const exclusive7 = { taxRateMilliPct: 7000, taxMode: 'exclusive' as const };
  const exclusive10 = { taxRateMilliPct: 10000, taxMode: 'exclusive' as const };
  const inclusive20 = { taxRateMilliPct: 20000, taxMode: 'inclusive' as const };

  it('adds the tax on top in exclusive mode', () => {
    // SSUTA §324 example: $3.50 at 7 % → tax $0.25, so the customer pays $3.75
    expect(orderTotals([350], exclusive7)).toEqual({ subtotalCents: 350, discountCents: 0, taxCents: 25, totalCents: 375 });
  });

  it('rounds the tax once per invoice, not per line', () => {
    // SSUTA §324 (per-invoice rounding): two $1.15 lines at 10 % → $2.30 × 10 % = $0.23 exactly;
    // rounding each line first would give 2 × $0.12 = $0.24
    const t = orderTotals([115, 115], exclusive10);
    expect(t.taxCents).toBe(23);
    expect(t.totalCents).toBe(253);
  });

  it('does not add the tax in inclusive mode', () => {
    // Hand-worked: 107 inclusive at 7 % holds 7 cents of tax; the total stays 107
    const t = orderTotals([107], { taxRateMilliPct: 7000, taxMode: 'inclusive' });
    expect(t.taxCents).toBe(7);
    expect(t.totalCents).toBe(107);
  });

  it('takes the discount off before the tax', () => {
    // Hand-worked: (400 + 250) − 150 = 500 taxable; 10 % of 500 = 50; total 550
    expect(orderTotals([400, 250], exclusive10, 150)).toEqual({
      subtotalCents: 650,
      discountCents: 150,
      taxCents: 50,
      totalCents: 550,
    });
    // Hand-worked, inclusive: (600 + 442) − 42 = 1000; 1000/6 = 166.67 → 167 tax inside; total 1000
    const t = orderTotals([600, 442], inclusive20, 42);
    expect(t.taxCents).toBe(167);
    expect(t.totalCents).toBe(1000);
  });

  it('never taxes or charges below zero when the discount exceeds the subtotal', () => {
    // Hand-worked: 300 − 500 → taxable floored at 0
    const t = orderTotals([300], exclusive10, 500);
    expect(t.taxCents).toBe(0);
    expect(t.totalCents).toBe(0);
    // and the discount reported is what was actually taken off: the whole 300, not 500
    expect(t.discountCents).toBe(300);
  });
});

describe('formatCents', () => {
  it('shows cents as dollars', () => {
    // Hand-worked: 1234 cents = $12.34 (en-US currency format)
    expect(formatCents(1234)).toBe('$12.34');
  });
});
