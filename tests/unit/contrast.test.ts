// The theme's text/background pairs meet WCAG 2.2 AA: 4.5:1 for text, 3:1 for large text.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { contrastRatio } from '@/lib/contrast';

const css = readFileSync(new URL('../../src/styles.css', import.meta.url), 'utf8');
const token = (name: string) => {
  const m = new RegExp(`--color-${name}:\\s*(#[0-9a-f]{6})`, 'i').exec(css);
  if (!m) throw new Error(`no token ${name}`);
  return m[1];
};

describe('contrast ratio', () => {
  it('matches the WCAG definition at its end points', () => {
    // WCAG 2.2, "contrast ratio" definition: black on white is 21:1, a colour on itself 1:1
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 5);
    expect(contrastRatio('#777777', '#777777')).toBeCloseTo(1, 5);
  });
  it('agrees with a published pair', () => {
    // #767676 on white is the well-known lightest grey that passes 4.5:1 (about 4.54:1; from memory)
    expect(contrastRatio('#767676', '#ffffff')).toBeGreaterThan(4.5);
    expect(contrastRatio('#777777', '#ffffff')).toBeLessThan(4.5);
  });
});

describe('Jugline theme pairs', () => {
  const text: [string, string][] = [
    ['crema-100', 'roast-950'],
    ['crema-100', 'roast-850'],
    ['crema-100', 'roast-750'],
    ['crema-300', 'roast-950'],
    ['crema-300', 'roast-850'],
    ['crema-300', 'roast-750'],
    ['alert-ink', 'roast-750'],
    ['roast-950', 'alert-ink'],
    ['ink-900', 'alert-ink'],
    ['ink-900', 'steam-50'],
    ['ink-900', 'steam-100'],
    ['ink-600', 'steam-50'],
    ['ink-600', 'steam-100'],
    ['steam-50', 'copper-700'],
    ['copper-700', 'steam-50'],
    ['roast-950', 'crema-100'],
    ['steam-50', 'ink-900'],
  ];
  it.each(text)('%s on %s is at least 4.5:1', (fg, bg) => {
    expect(contrastRatio(token(fg), token(bg))).toBeGreaterThanOrEqual(4.5);
  });
  it('the pour line and focus ring stand out from the lane at 3:1 (non-text contrast)', () => {
    expect(contrastRatio(token('copper-500'), token('roast-950'))).toBeGreaterThanOrEqual(3);
    expect(contrastRatio(token('copper-300'), token('roast-950'))).toBeGreaterThanOrEqual(3);
  });
});
