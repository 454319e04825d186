// Display units. Volumes are stored in millilitres and temperatures thought of in degrees Celsius;
// a café chooses what its staff and customers read. Nothing stored is ever converted.

export const VOLUME_UNITS = ['ml', 'us_floz'] as const;
export type VolumeUnit = (typeof VOLUME_UNITS)[number];
export const TEMPERATURE_UNITS = ['C', 'F'] as const;
export type TemperatureUnit = (typeof TEMPERATURE_UNITS)[number];

export const VOLUME_UNIT_LABEL: Record<VolumeUnit, string> = { ml: 'Millilitres (ml)', us_floz: 'US fluid ounces (oz)' };
export const TEMPERATURE_UNIT_LABEL: Record<TemperatureUnit, string> = { C: 'Celsius (°C)', F: 'Fahrenheit (°F)' };

/**
 * 1 US fluid ounce = 1/128 US gallon = 231/128 in³ = 29.5735295625 mL, exactly. Not the 30 mL
 * "fluid ounce" of US nutrition labels, which is a labelling convention, not a cup size.
 */
export const ML_PER_US_FLOZ = 29.5735295625;

export const mlToUsFlOz = (ml: number) => ml / ML_PER_US_FLOZ;
export const usFlOzToMl = (oz: number) => oz * ML_PER_US_FLOZ;

export const celsiusToFahrenheit = (c: number) => 1.8 * c + 32;
export const fahrenheitToCelsius = (f: number) => (f - 32) / 1.8;

/**
 * A cup size — or any volume the Bar shows: a pitcher, its fill — as the café's people read it. In ounces it is rounded to the nearest half ounce
 * (halves rounding up): cups are sold by nominal whole and half ounces, so a 350 ml cup
 * (11.83 oz) reads "12 oz" like the sleeve it comes in, and a 160 ml cup (5.41 oz) "5.5 oz";
 * a finer step would print "11.8 oz", which nobody orders by. Millilitres are whole.
 */
export function cupSizeLabel(ml: number, unit: VolumeUnit): string {
  if (unit === 'ml') return `${Math.round(ml)} ml`;
  const halves = Math.max(1, Math.round(mlToUsFlOz(ml) * 2));
  return `${halves % 2 === 0 ? halves / 2 : (halves / 2).toFixed(1)} oz`;
}

/** The ounces a volume really is, to one decimal, for the owner's preview ("11.8 US fl oz"). */
export const exactUsFlOz = (ml: number) => `${mlToUsFlOz(ml).toFixed(1)} US fl oz`;

/** A temperature given in °C, shown in the café's unit to the whole degree: 70 °C → "158 °F". */
export function temperatureLabel(celsius: number, unit: TemperatureUnit): string {
  const value = unit === 'C' ? celsius : celsiusToFahrenheit(celsius);
  return `${Math.round(value)} °${unit}`;
}

/**
 * Common practice at the steam wand (no published standard; docs/check-values.md, "Milk and
 * pitchers"): steamed milk is served at about 55–65 °C and the steam itself is about 130 °C. How
 * fast that burns comes from published data (./cautions.ts), not from here.
 */
export const STEAM = { servedFromC: 55, servedToC: 65, wandSteamC: 130 } as const;
