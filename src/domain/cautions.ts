// The hot-drink and steam cautions, in one place for every screen that shows them. Their numbers
// are the published hot-water burn times (docs/check-values.md, "Temperatures and burns"): milk at
// the usual serving heat burns skin in seconds, so no caution may suggest that milk is safe below
// some "scald" point. They defer to the café's local code and training.
import { STEAM, temperatureLabel, type TemperatureUnit } from './units';

/**
 * Hot water on adult skin: how long until a serious (full-thickness) burn. The exposure table
 * usually credited to Moritz & Henriques (1947), as commonly tabulated.
 */
export const BURN_TIMES = [
  { celsius: 60, seconds: 3 },
  { celsius: 55, seconds: 17 },
  { celsius: 49, seconds: 8 * 60 },
] as const;

/** Hot drinks are often served at 71–85 °C (Brown & Diller, Burns 2008). */
export const HOT_DRINKS_SERVED_C = { from: 71, to: 85 } as const;

/** "60 °C", or "60 °C (140 °F)" where both units are wanted. */
export const temp = (c: number, unit: TemperatureUnit, both = false) =>
  both ? `${temperatureLabel(c, unit)} (${temperatureLabel(c, unit === 'C' ? 'F' : 'C')})` : temperatureLabel(c, unit);

/** "55–65 °C" */
export const tempRange = (fromC: number, toC: number, unit: TemperatureUnit) => `${temperatureLabel(fromC, unit).split(' ')[0]}–${temperatureLabel(toC, unit)}`;

const [sixty, fiftyFive, fortyNine] = BURN_TIMES;

/** The Bar's one-line footer. */
export function barCaution(unit: TemperatureUnit, both = false): string {
  return (
    `Caution: milk and drinks at serving heat burn skin in seconds — water at ${temp(sixty.celsius, unit, both)} causes a serious burn in about ${sixty.seconds} s. ` +
    `Steam at the wand is about ${temp(STEAM.wandSteamC, unit, both)}: purge and wipe it. Follow your local food code.`
  );
}

/** The owner's note where milk and temperatures are set (menu editor, settings). */
export function hotMilkNote(unit: TemperatureUnit, both = false): string {
  return (
    `Steamed milk is usually served at about ${tempRange(STEAM.servedFromC, STEAM.servedToC, unit)} and hot drinks often at ` +
    `${tempRange(HOT_DRINKS_SERVED_C.from, HOT_DRINKS_SERVED_C.to, unit)}, which is hot enough to burn: hot water causes a serious burn ` +
    `in about ${sixty.seconds} seconds at ${temp(sixty.celsius, unit, both)}, about ${fiftyFive.seconds} seconds at ${temp(fiftyFive.celsius, unit, both)} ` +
    `and about ${fortyNine.seconds / 60} minutes at ${temp(fortyNine.celsius, unit, both)} (published burn times for water on skin). ` +
    `Steam at the wand is about ${temp(STEAM.wandSteamC, unit, both)}. Follow your local food code and your training.`
  );
}

/** Pickup, for customers. */
export const PICKUP_CAUTION = 'Careful — hot drinks can burn in seconds.';
