// Display units against published values (docs/check-values.md, "Units", "Temperatures and burns").
import { describe, expect, it } from 'vitest';
import {
  celsiusToFahrenheit,
  cupSizeLabel,
  exactUsFlOz,
  fahrenheitToCelsius,
  ML_PER_US_FLOZ,
  mlToUsFlOz,
  STEAM,
  temperatureLabel,
  usFlOzToMl,
} from '@/domain/units';
import { milliToPercent, percentToMilli } from '@/domain/settings-schemas';

describe('US fluid ounces', () => {
  it('1 US fl oz is 29.5735295625 mL exactly', () => {
    // NIST Handbook 44, Appendix C, liquid volume (docs/check-values.md, "Units"): 1 fl oz = 1/128 gal = 231/128 in³ = 29.573 529 562 5 mL
    expect(ML_PER_US_FLOZ).toBe(29.5735295625);
    // the same from its definition: 231 in³ per gallon, 2.54 cm per inch (exact), 128 fl oz per gallon
    expect((231 * 2.54 ** 3) / 128).toBeCloseTo(29.5735295625, 10);
    // NIST SP 811, Appendix B.8 (docs/check-values.md, "Units"): fluid ounce (U.S.) = 2.957 353 × 10⁻⁵ m³ (1 m³ = 10⁶ mL)
    expect(usFlOzToMl(1) / 1e6).toBeCloseTo(2.957353e-5, 11);
  });

  it('converts both ways', () => {
    // NIST Handbook 44, Appendix C: 1 US gallon = 128 fl oz = 3.785 411 784 L (from memory of the table)
    expect(usFlOzToMl(128)).toBeCloseTo(3785.411784, 6);
    expect(mlToUsFlOz(3785.411784)).toBeCloseTo(128, 9);
    // 12 fl oz × 29.5735295625 mL (NIST Handbook 44, Appendix C) = 354.882 354 75 mL
    expect(usFlOzToMl(12)).toBeCloseTo(354.88235475, 8);
    expect(mlToUsFlOz(usFlOzToMl(16))).toBeCloseTo(16, 12); // there and back (hand-worked)
  });

  it('is not the 30 mL nutrition-label ounce: 12 US fl oz ≠ 360 mL', () => {
    // 21 CFR 101.9(b)(5)(viii) rounds the fluid ounce to 30 mL for nutrition labels only; a cup
    // size uses the NIST ounce (Handbook 44, Appendix C) — both in docs/check-values.md, "Units"
    expect(ML_PER_US_FLOZ).not.toBe(30);
    expect(usFlOzToMl(12)).not.toBeCloseTo(360, 0);
    expect(360 - usFlOzToMl(12)).toBeGreaterThan(5);
    // a 16 oz cup by the 30 mL ounce would be 480 mL; by the NIST ounce it is 473.18 mL
    expect(usFlOzToMl(16)).toBeCloseTo(473.176473, 5);
  });
});

describe('cup size labels', () => {
  it('in ml: whole millilitres', () => {
    // hand-worked: 354.88 rounds to 355
    expect(cupSizeLabel(350, 'ml')).toBe('350 ml');
    expect(cupSizeLabel(354.88, 'ml')).toBe('355 ml');
  });

  it('in oz: to the nearest half ounce, as cups are sold (NIST Handbook 44 ounce)', () => {
    // 355 mL ÷ 29.5735295625 = 12.004 → 12 oz; 354.88 mL is 12 oz exactly
    expect(cupSizeLabel(355, 'us_floz')).toBe('12 oz');
    expect(cupSizeLabel(usFlOzToMl(12), 'us_floz')).toBe('12 oz');
    // the demo café's cups: 240 mL = 8.12 oz, 350 mL = 11.83 oz, 470 mL = 15.89 oz
    expect(cupSizeLabel(240, 'us_floz')).toBe('8 oz');
    expect(cupSizeLabel(350, 'us_floz')).toBe('12 oz');
    expect(cupSizeLabel(470, 'us_floz')).toBe('16 oz');
    // 160 mL = 5.41 oz → 5.5 oz; 53 mL = 1.79 oz → 2 oz
    expect(cupSizeLabel(160, 'us_floz')).toBe('5.5 oz');
    expect(cupSizeLabel(53, 'us_floz')).toBe('2 oz');
  });

  it('rounds halves up and never shows 0 oz for a real cup', () => {
    // our own rule (nearest half ounce, halves up, at least 0.5), on the NIST ounce (docs/check-values.md, "Units")
    // 11.75 oz is exactly between 11.5 and 12: it reads 12 oz
    expect(cupSizeLabel(usFlOzToMl(11.75), 'us_floz')).toBe('12 oz');
    expect(cupSizeLabel(usFlOzToMl(11.74), 'us_floz')).toBe('11.5 oz');
    expect(cupSizeLabel(5, 'us_floz')).toBe('0.5 oz');
  });

  it('the owner’s preview gives the exact ounces to one decimal', () => {
    // 350 mL ÷ 29.5735295625 mL (NIST Handbook 44, Appendix C; docs/check-values.md, "Units") = 11.835
    expect(exactUsFlOz(350)).toBe('11.8 US fl oz');
  });
});

describe('temperatures', () => {
  it('°F = 1.8 · °C + 32 and back, exactly (NIST SP 811, Appendix B)', () => {
    // docs/check-values.md, "Units"; the fixed points of water at standard pressure (from memory),
    // and −40 where the scales meet (hand-worked)
    expect(celsiusToFahrenheit(0)).toBe(32);
    expect(celsiusToFahrenheit(100)).toBe(212);
    expect(celsiusToFahrenheit(-40)).toBe(-40);
    expect(fahrenheitToCelsius(212)).toBe(100);
    expect(fahrenheitToCelsius(celsiusToFahrenheit(37))).toBeCloseTo(37, 12);
  });

  it('labels to the whole degree', () => {
    // 1.8 × 70 + 32 = 158 (NIST SP 811, Appendix B; docs/check-values.md, "Units")
    expect(temperatureLabel(70, 'F')).toBe('158 °F');
    expect(temperatureLabel(70, 'C')).toBe('70 °C');
    // FDA Food Code §3-501.16(A) (docs/check-values.md, "Temperatures and burns"): hot holding at
    // 57 °C (135 °F); cold holding at 5 °C (41 °F)
    expect(temperatureLabel(57, 'F')).toBe('135 °F');
    expect(temperatureLabel(5, 'F')).toBe('41 °F');
  });

  it('the steam caution’s numbers (common practice) read in °F', () => {
    // docs/check-values.md, "Milk and pitchers (common practice)": served at about 55–65 °C, wand
    // steam about 130 °C; in °F by NIST SP 811, Appendix B: 131, 149, 266
    expect([STEAM.servedFromC, STEAM.servedToC, STEAM.wandSteamC].map((c) => temperatureLabel(c, 'F'))).toEqual(['131 °F', '149 °F', '266 °F']);
  });
});

describe('tax rates typed as a percent', () => {
  it('become thousandths of a percent without floating point (DEVELOPERS.md: 8.25 % = 8250)', () => {
    // 8.875 % is the rate of the Streamlined Sales and Use Tax Agreement §324 example (docs/check-values.md,
    // "Money"); the rest hand-worked, and the refusals are our own input rules
    expect(percentToMilli('8.875')).toBe(8875);
    expect(percentToMilli('8.25')).toBe(8250);
    expect(percentToMilli('7')).toBe(7000);
    expect(percentToMilli('0.001')).toBe(1);
    expect(percentToMilli('100')).toBe(100_000);
    for (const bad of ['8.2555', '100.001', '-1', '8,25', '', '1e2', '8.']) expect(percentToMilli(bad), bad).toBeNull();
    expect([8250, 8875, 7000, 1, 0].map(milliToPercent)).toEqual(['8.25', '8.875', '7', '0.001', '0']);
  });
});
