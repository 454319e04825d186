// The text/background pairs the Team screen, the welcome page, the switch dialog and the Bar
// card's "who" line add meet WCAG 2.2 AA for normal text (4.5:1, Success Criterion 1.4.3).
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

describe('team screens', () => {
  const pairs: [text: string, background: string, where: string][] = [
    ['copper-700', 'white', 'the "Invited" badge and a refused command on the Team table'],
    ['copper-700', 'steam-50', 'field errors and the PIN pad message'],
    ['ink-600', 'white', 'sign-in names and link times in the Team table'],
    ['ink-600', 'steam-100', 'the row under an open panel'],
    ['ink-900', 'steam-200', 'the "you" mark'],
    ['crema-300', 'roast-750', 'who took and who is making a drink, on the Bar card'],
  ];
  for (const [fg, bg, where] of pairs) {
    it(`${fg} on ${bg} (${where}) is at least 4.5:1`, () => {
      expect(contrastRatio(token(fg), token(bg))).toBeGreaterThanOrEqual(4.5);
    });
  }
});
