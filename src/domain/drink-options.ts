// Drink options a guest asks for at the counter — wet, more foam, dry, kids' temperature — are
// extras the owner marks with what they do at the bar. The effect changes the drink as it is
// stored, so the jug plan, the Bar card and the milk used in the reports all follow:
// - the texture changes (wet: flat, short stretch; more foam: one stretch longer; dry: long
//   stretch, foamy), and the cold milk changes with it so the cup still fills: a foamier texture
//   grows more in the jug, so it takes less cold milk (milk × (100 + growth before) / (100 +
//   growth after), with the café's own milk growth figures);
// - dry takes a fifth less milk again on top of that: a dry cappuccino's cup is mostly stiff foam
//   (common practice; the figure is ours, from memory of bar training, not a published standard);
// - kids' temperature: the drink's jug is steamed cooler, so it never shares a jug with drinks
//   steamed to the usual temperature (the jug plan keeps them apart).
// An option with no effect (light ice, half-caf) is shown on the Bar card like any extra.
import type { SteamedTexture } from './jug-plan';
import type { Texture } from './types';

export const BAR_EFFECTS = ['wet', 'more_foam', 'dry', 'kids_temp'] as const;
export type BarEffect = (typeof BAR_EFFECTS)[number];

/** What the owner reads when choosing an extra's effect in Menu. */
export const BAR_EFFECT_LABEL: Record<BarEffect, string> = {
  wet: 'Wet: flat milk, less foam, more milk',
  more_foam: 'More foam: one stretch longer, less milk',
  dry: 'Dry: long stretch, mostly foam, least milk',
  kids_temp: "Kids' temperature: steamed cooler, in a jug of its own",
};

/** The effect's name alone, for a list of extras: "Dry". */
export const BAR_EFFECT_NAME: Record<BarEffect, string> = {
  wet: 'Wet',
  more_foam: 'More foam',
  dry: 'Dry',
  kids_temp: "Kids' temperature",
};

/** The café's milk growth when the settings are not at hand (the settings' own defaults). */
export const DEFAULT_MILK_GROWTH_PCT: Record<SteamedTexture, number> = { flat: 15, silky: 25, foamy: 75 };
/** Dry: this share of the milk that would fill the cup with foamy milk. */
export const DRY_MILK_PCT = 80;
/** Kids' temperature, steamed to about this (common practice, from memory; the café's own rule comes first). */
export const KIDS_TEMP_C = 50;

const ORDER: SteamedTexture[] = ['flat', 'silky', 'foamy'];
const steamed = (t: Texture | null): t is SteamedTexture => t === 'flat' || t === 'silky' || t === 'foamy';

export interface MilkDrink {
  texture: Texture | null;
  milkMl: number;
}

/** The drink as the bar makes it with these effects; `kidsTemp` when its jug is steamed cooler. */
export function withBarEffects(drink: MilkDrink, effects: readonly BarEffect[], growthPct = DEFAULT_MILK_GROWTH_PCT): MilkDrink & { kidsTemp: boolean } {
  const kidsTemp = effects.includes('kids_temp');
  // iced and milkless drinks: nothing to stretch
  if (!steamed(drink.texture) || drink.milkMl <= 0) return { ...drink, kidsTemp };
  let texture: SteamedTexture = drink.texture;
  if (effects.includes('wet')) texture = 'flat';
  if (effects.includes('more_foam')) texture = ORDER[Math.min(ORDER.indexOf(texture) + 1, ORDER.length - 1)];
  const dry = effects.includes('dry');
  if (dry) texture = 'foamy';
  const fill = (drink.milkMl * (100 + growthPct[drink.texture])) / (100 + growthPct[texture]);
  const milkMl = Math.round(dry ? (fill * DRY_MILK_PCT) / 100 : fill);
  return { texture, milkMl, kidsTemp };
}
