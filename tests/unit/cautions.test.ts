// The hot-drink and steam cautions, worded from published burn times (docs/check-values.md,
// "Temperatures and burns") rather than from the temperature at which milk starts to taste cooked.
import { describe, expect, it } from 'vitest';
import { BURN_TIMES, HOT_DRINKS_SERVED_C, barCaution, hotMilkNote, PICKUP_CAUTION } from '@/domain/cautions';

describe('the burn figures', () => {
  it('are the hot-water exposure times as commonly tabulated', () => {
    // docs/check-values.md, "Temperatures and burns" (Moritz & Henriques 1947, secondary copy):
    // 60 °C → about 3 s; 55 °C → about 17 s; 49 °C → about 8 min
    expect(BURN_TIMES).toEqual([
      { celsius: 60, seconds: 3 },
      { celsius: 55, seconds: 17 },
      { celsius: 49, seconds: 8 * 60 },
    ]);
    // docs/check-values.md (Brown & Diller 2008): hot drinks often served at 71–85 °C
    expect(HOT_DRINKS_SERVED_C).toEqual({ from: 71, to: 85 });
  });
});

describe('the Bar’s caution line', () => {
  it('says milk burns in seconds at serving heat, not only "above 70 °C"', () => {
    // docs/check-values.md, "Temperatures and burns": water at 60 °C burns in about 3 s
    const line = barCaution('C');
    expect(line).toContain('60 °C');
    expect(line).toContain('about 3 s');
    expect(line).not.toMatch(/above about 70/);
    // docs/check-values.md, "Milk and pitchers (common practice)": steam at the wand about 130 °C
    expect(line).toContain('130 °C');
    expect(line).toMatch(/local (food )?code/);
  });

  it('reads in °F, or both units before the café’s unit is known', () => {
    // docs/check-values.md, "Units": °F = 1.8 × °C + 32 → 60 °C = 140 °F, 130 °C = 266 °F
    expect(barCaution('F')).toContain('140 °F');
    expect(barCaution('F')).toContain('266 °F');
    expect(barCaution('C', true)).toContain('60 °C (140 °F)');
  });
});

describe('the owner’s note (menu editor, settings)', () => {
  it('gives the three burn times, the serving range and defers to the local code', () => {
    // docs/check-values.md, "Temperatures and burns" and "Milk and pitchers (common practice)"
    const note = hotMilkNote('C');
    for (const bit of ['55–65 °C', '71–85 °C', '60 °C', 'about 3 seconds', '55 °C', 'about 17 seconds', '49 °C', 'about 8 minutes', '130 °C']) {
      expect(note, bit).toContain(bit);
    }
    expect(note).toMatch(/local food code/);
    expect(note).not.toMatch(/scald/);
  });
});

describe('Pickup', () => {
  it('warns that a hot drink can burn in seconds', () => {
    // docs/check-values.md, "Temperatures and burns": seconds at serving temperatures
    expect(PICKUP_CAUTION).toMatch(/hot/);
    expect(PICKUP_CAUTION).toMatch(/seconds/);
  });
});
