// Quantities keep their units on the same line (common practice in typesetting: a no-break space
// between a number and its unit symbol, as SI brochure §5.4.3 writes "a space" that must not break).
import { describe, expect, it } from 'vitest';
import { keepUnits } from '@/lib/keep-units';

describe('keepUnits', () => {
  it('joins a number to the unit after it, and nothing else', () => {
    expect(keepUnits('1,000 g')).toBe('1,000\u00a0g');
    expect(keepUnits('18.0 g → 36.0 g · 28 s · 1:2.0')).toBe('18.0\u00a0g → 36.0\u00a0g · 28\u00a0s · 1:2.0');
    expect(keepUnits('in about 6 h of service')).toBe('in about 6\u00a0h of service');
    expect(keepUnits('2 shots · 3 green')).toBe('2 shots · 3 green');
  });
});

describe("the dial-in window in the bar's words", () => {
  it('applies the ratio to the house dose, to the whole gram (18 g × 1.8 = 32.4 → 32; × 2.2 = 39.6 → 40, arithmetic)', async () => {
    const { goodShotWords } = await import('@/features/dial-in/shot-view');
    const w = { doseMinDg: 170, doseMaxDg: 190, ratioMinX10: 18, ratioMaxX10: 22, timeMinS: 25, timeMaxS: 30 };
    expect(goodShotWords(w, 180)).toBe("A good shot here: 18 g in, 32–40 g out in 25–30 s — the café's own target");
    // without a recipe: the dose range, and the yield from its middle (18 g × 2.0 = 36, arithmetic)
    expect(goodShotWords({ ...w, ratioMinX10: 20, ratioMaxX10: 20 }, null)).toBe("A good shot here: 17–19 g in, 36 g out in 25–30 s — the café's own target");
  });
});
