// How the screens write a brew ratio, a duration and an ordinal: one formatter each, used by every
// screen (src/domain/format.ts).
import { describe, expect, it } from 'vitest';
import { brewRatioX10, durationWords, formatDuration, formatRatio, ordinal, ratioLabel } from '@/domain/format';

describe('brew ratio', () => {
  it('is yield ÷ dose to one decimal, halves rounded up', () => {
    // docs/check-values.md, "Espresso and beans": brew ratio = yield ÷ dose, about 1:2 (common practice)
    expect(formatRatio(brewRatioX10(180, 360))).toBe('1:2.0');
    // hand-worked: 38.7 ÷ 18 = 2.15 exactly → 1:2.2 (halves up; docs/check-values.md, "Espresso and beans")
    expect(formatRatio(brewRatioX10(180, 387))).toBe('1:2.2');
    // hand-worked: 38.6 ÷ 18 = 2.144 → 1:2.1; 40 ÷ 18 = 2.22 → 1:2.2
    expect(formatRatio(brewRatioX10(180, 386))).toBe('1:2.1');
    expect(formatRatio(brewRatioX10(180, 400))).toBe('1:2.2');
  });

  it('the menu editor’s label is the same formatter, and nothing without a dose or a yield', () => {
    // hand-worked: same dose and yield, same text on every screen
    expect(ratioLabel(180, 387)).toBe('1:2.2');
    expect(ratioLabel(0, 360)).toBeNull();
    expect(ratioLabel(180, 0)).toBeNull();
  });
});

describe('durations', () => {
  it('minutes and seconds as they are', () => {
    // hand-worked: 90 s = 1 min 30 s; 272.5 s rounds to 273 s = 4:33
    expect(formatDuration(90)).toBe('1:30');
    expect(formatDuration(240)).toBe('4:00');
    expect(formatDuration(272.5)).toBe('4:33');
    expect(formatDuration(5)).toBe('0:05');
    expect(formatDuration(null)).toBe('—');
    expect(formatDuration(Infinity)).toBe('—');
  });

  it('in a sentence: seconds under a minute, m:ss from a minute on', () => {
    // hand-worked
    expect(durationWords(20)).toBe('20 s');
    expect(durationWords(59.6)).toBe('1:00');
    expect(durationWords(90)).toBe('1:30');
    expect(durationWords(330)).toBe('5:30');
  });
});

describe('ordinals', () => {
  it('English suffixes: st, nd, rd, and th for 11–13', () => {
    // English usage (from memory): 1st 2nd 3rd 4th; 11th 12th 13th; 21st 22nd 23rd; 101st 111th 112th
    expect([1, 2, 3, 4, 10].map(ordinal)).toEqual(['1st', '2nd', '3rd', '4th', '10th']);
    expect([11, 12, 13, 14].map(ordinal)).toEqual(['11th', '12th', '13th', '14th']);
    expect([21, 22, 23, 24].map(ordinal)).toEqual(['21st', '22nd', '23rd', '24th']);
    expect([101, 111, 112, 113, 122].map(ordinal)).toEqual(['101st', '111th', '112th', '113th', '122nd']);
  });
});
