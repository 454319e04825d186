// Recipe units in the menu editor: grams typed as text ↔ tenths of a gram stored, and the brew ratio.
import { describe, expect, it } from 'vitest';
import { brewRatioX10, formatRatio, ratioLabel } from '@/domain/format';
import { centsToAmountText, dgToGramsText, parseGramsToDg, parseWhole } from '@/domain/menu-units';

describe('grams ↔ tenths of a gram', () => {
  it('reads what an owner types', () => {
    // 1 g = 10 dg by the SI prefix deci- (BIPM SI Brochure, 9th ed.; docs/check-values.md, "Units", from memory)
    expect(parseGramsToDg('18')).toBe(180);
    expect(parseGramsToDg('18.5')).toBe(185);
    expect(parseGramsToDg('18,5')).toBe(185); // a decimal comma, as European owners write it
    expect(parseGramsToDg(' 36 g ')).toBe(360);
    expect(parseGramsToDg('')).toBe(0);
  });
  it('refuses what is not grams to a tenth', () => {
    // our own input rule: grams to a tenth, as a kitchen scale shows them
    for (const bad of ['18.55', '-18', 'eighteen', '1e2', '18..5', '.5']) expect(parseGramsToDg(bad), bad).toBeNull();
  });
  it('writes them back the way they were typed', () => {
    // hand-worked: 180 dg = 18 g (docs/check-values.md, "Units": 1 g = 10 dg)
    expect(dgToGramsText(180)).toBe('18');
    expect(dgToGramsText(185)).toBe('18.5');
    expect(dgToGramsText(0)).toBe('0');
    for (const dg of [5, 50, 185, 999, 1200]) expect(parseGramsToDg(dgToGramsText(dg))).toBe(dg);
  });
});

describe('brew ratio in the menu editor', () => {
  it('is the one formatter the dial-in log uses: the same dose and yield read the same', () => {
    // hand-worked: 38.7 ÷ 18 = 2.15 → 1:2.2 on both screens (it read 1:2.1 in the editor, 1:2.2 in the log)
    expect(ratioLabel(180, 387)).toBe(formatRatio(brewRatioX10(180, 387)));
    expect(ratioLabel(180, 387)).toBe('1:2.2');
  });
  it('is yield ÷ dose', () => {
    // docs/check-values.md, "Espresso and beans" (common practice): 18 g in, 36 g out is about 1:2
    expect(ratioLabel(180, 360)).toBe('1:2.0');
    // the demo house recipe, 19 g → 38 g (hand-worked: 2.0)
    expect(ratioLabel(190, 380)).toBe('1:2.0');
    // 18 g → 27 g, a "ristretto-style" 1:1.5 (common practice, from memory)
    expect(ratioLabel(180, 270)).toBe('1:1.5');
  });
  it('has no ratio without a dose or a yield', () => {
    // hand-worked: a ratio needs both
    expect(ratioLabel(0, 360)).toBeNull();
    expect(ratioLabel(180, 0)).toBeNull();
  });
});

describe('fields', () => {
  it('whole numbers', () => {
    // our own input rule: digits only, hand-checked
    expect(parseWhole('240')).toBe(240);
    expect(parseWhole(' 2 ')).toBe(2);
    expect(parseWhole('')).toBe(0);
    for (const bad of ['2.5', '-1', 'two', '1e3']) expect(parseWhole(bad), bad).toBeNull();
  });
  it('cents as an amount for a price field', () => {
    // integer cents: 560 ¢ = 5.60 (hand-checked)
    expect(centsToAmountText(560)).toBe('5.60');
    expect(centsToAmountText(5)).toBe('0.05');
    expect(centsToAmountText(100_000)).toBe('1000.00');
  });
});
