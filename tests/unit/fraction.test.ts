// Exact fractions for the bar's keep-up decision (src/domain/fraction.ts). All hand-worked.
import { describe, expect, it } from 'vitest';
import { compare, floor, fraction, mul, sub, toNumber } from '@/domain/fraction';

describe('fraction', () => {
  it('reduces, and keeps the sign on top', () => {
    // hand-worked: 6/4 = 3/2; 3/−6 = −1/2
    expect(fraction(6, 4)).toEqual({ num: 3n, den: 2n });
    expect(fraction(3, -6)).toEqual({ num: -1n, den: 2n });
    expect(() => fraction(1, 0)).toThrow(RangeError);
  });

  it('takes a double at its exact value: 0.1 is not 1/10', () => {
    // IEEE 754 double (from memory): 0.1 is 3602879701896397 / 2^55, 0.5 is exactly 1/2
    expect(fraction(0.5)).toEqual({ num: 1n, den: 2n });
    expect(fraction(0.1)).toEqual({ num: 3602879701896397n, den: 2n ** 55n });
  });

  it('72 drinks in 1800 s at 75 s a drink is exactly 3', () => {
    // hand-worked: 72 × 75 / 1800 = 5400 / 1800 = 3; floating point gave 2.4 / 0.8 = 2.9999999999999996
    const load = mul(fraction(72, 1800), fraction(75));
    expect(compare(load, fraction(3))).toBe(0);
    expect(2.4 / 0.8).toBeLessThan(3);
  });

  it('compares, subtracts, floors and converts', () => {
    // hand-worked
    expect(compare(fraction(1, 3), fraction(1, 2))).toBe(-1);
    expect(compare(fraction(2, 3), fraction(1, 2))).toBe(1);
    expect(sub(fraction(3), fraction(2999, 1000))).toEqual({ num: 1n, den: 1000n });
    expect(floor(fraction(26, 5))).toBe(5n);
    expect(floor(fraction(-1, 2))).toBe(-1n);
    expect(toNumber(fraction(96))).toBe(96);
    expect(toNumber(fraction(1, 3))).toBeCloseTo(1 / 3, 15);
  });
});
