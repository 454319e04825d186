// The menu editor's own text/background pairs (on white cards) meet WCAG 2.2 AA: 4.5:1 for text.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { contrastRatio } from '@/lib/contrast';

const css = readFileSync(new URL('../../src/styles.css', import.meta.url), 'utf8');
const token = (name: string) => {
  if (name === 'white') return '#ffffff';
  const m = new RegExp(`--color-${name}:\\s*(#[0-9a-f]{6})`, 'i').exec(css);
  if (!m) throw new Error(`no token ${name}`);
  return m[1];
};

describe('menu editor pairs', () => {
  // WCAG 2.2 SC 1.4.3: 4.5:1 for normal text
  const pairs: [string, string][] = [
    ['ink-900', 'white'], // table text, status "On"
    ['ink-600', 'white'], // hints, headers, "none on the list"
    ['copper-700', 'white'], // "86'd" status, field errors, problem notices
    ['steam-50', 'ink-900'], // chosen chips and tabs
    ['ink-600', 'steam-100'], // retired rows
  ];
  it.each(pairs)('%s on %s is at least 4.5:1', (fg, bg) => {
    expect(contrastRatio(token(fg), token(bg))).toBeGreaterThanOrEqual(4.5);
  });
});
