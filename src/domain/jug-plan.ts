// The jug plan: which queued drinks of a milk lane to steam together, in which pitcher, with how
// much cold milk, poured in which order. Jugs a barista has started are not planned here: they are
// stored and stay as they were started (src/domain/lanes.ts puts them first).
//
// Rules (common practice at a busy bar; the café sets the numbers in Settings):
// - drinks are taken oldest first, and a jug never skips an older drink to take a newer one,
//   so batching never makes the oldest ticket wait;
// - a jug holds at most the café's drinks per jug (two to four cups is usual: the last cups of a
//   bigger jug get milk whose foam has separated);
// - a jug takes the smallest pitcher that holds it: its cold milk (the drinks' milk plus the waste
//   allowance) stays at or under the fill line (cold milk to just below the base of the spout),
//   and that milk grown by its texture (flat about 15 %, silky 25 %, foamy 75 %) stays in the
//   pitcher (at or under its capacity, the brim at the spout);
// - a pitcher is never filled under its minimum (enough milk to cover the steam tip): a jug that
//   needs less is poured at the minimum and the extra is shown as waste;
// - when no pitcher holds the next drink too, the jug closes and the next one starts;
// - the jug is steamed for the foamiest texture in it and poured thinnest first (flat, then
//   silky, then foamy), since the foam rises to the top as the jug empties;
// - a jug is steamed to one temperature: a drink asked at kids' temperature (cooler) never shares
//   a jug with drinks steamed as usual (src/domain/drink-options.ts);
// - iced drinks take cold milk straight from the fridge: no jug.
import type { Texture } from './types';
import { KIDS_TEMP_C } from './drink-options';
import { celsiusToFahrenheit, cupSizeLabel, mlToUsFlOz, type VolumeUnit } from './units';

export type SteamedTexture = Exclude<Texture, 'cold'>;

export interface Pitcher {
  capacityMl: number;
  /** The most cold milk it takes: just below the base of the spout. */
  fillLineMl: number;
  /** The least cold milk that covers the steam tip. */
  minFillMl: number;
}

/** The café's rules for jugs (Settings → Bar and Pitchers). */
export interface JugRules {
  pitchers: Pitcher[];
  /** Milk lost per jug (left in the pitcher, purged), poured on top of the drinks' milk. */
  wasteMl: number;
  maxDrinks: number;
  /** How much cold milk grows when steamed for each texture, in percent. */
  expansionPct: Record<SteamedTexture, number>;
}

export interface JugDrink {
  id: number;
  milkMl: number;
  texture: Texture | null;
  /** Steamed cooler, for a child (a drink option); absent: as usual. */
  kidsTemp?: boolean;
}

export interface Jug {
  /** The stored jug once a barista has started it; null while it is only planned. */
  jugId: number | null;
  pitcher: Pitcher;
  /** Cold milk to pour into the pitcher. */
  coldMl: number;
  /** Of the cold milk, what no cup takes: the waste allowance, plus any top-up to the minimum. */
  wasteMl: number;
  /** Steam for this (the foamiest in the jug). */
  steamFor: SteamedTexture;
  /** Steamed cooler: every drink in it asked for kids' temperature; absent: as usual. */
  kidsTemp?: boolean;
  /** False only for a lone drink more than the largest pitcher holds by these rules. */
  fits: boolean;
  /** Pour order: thinnest texture first; oldest first within a texture. */
  drinkIds: number[];
}

const THICKNESS: Record<SteamedTexture, number> = { flat: 0, silky: 1, foamy: 2 };

export const needsJug = (d: JugDrink) => d.texture !== null && d.texture !== 'cold' && d.milkMl > 0;

const foamier = (a: SteamedTexture, b: SteamedTexture) => (THICKNESS[b] > THICKNESS[a] ? b : a);
const bySize = (pitchers: Pitcher[]) => [...pitchers].sort((a, b) => a.fillLineMl - b.fillLineMl || a.capacityMl - b.capacityMl);
const coldFor = (p: Pitcher, milkMl: number, rules: JugRules) => Math.max(milkMl + rules.wasteMl, p.minFillMl);

/** Cold milk under the fill line, and grown by its texture still in the pitcher (whole ml, no rounding). */
function holds(p: Pitcher, milkMl: number, steamFor: SteamedTexture, rules: JugRules): boolean {
  const cold = coldFor(p, milkMl, rules);
  return cold <= p.fillLineMl && cold * (100 + rules.expansionPct[steamFor]) <= p.capacityMl * 100;
}

/** The smallest pitcher that holds `milkMl` of drinks steamed for `steamFor`, if any. */
const pitcherFor = (milkMl: number, steamFor: SteamedTexture, rules: JugRules) => bySize(rules.pitchers).find((p) => holds(p, milkMl, steamFor, rules));

/**
 * These drinks (lane order, oldest first; each needing a jug) as one jug, or null when they can't
 * share one: too many, or no pitcher holds them. A lone drink always gets a jug (the largest
 * pitcher, marked as not fitting, when none holds it), so long as the café has a pitcher.
 */
export function makeJug(drinks: JugDrink[], rules: JugRules): Jug | null {
  if (drinks.length === 0 || rules.pitchers.length === 0 || drinks.length > rules.maxDrinks) return null;
  const kidsTemp = !!drinks[0].kidsTemp;
  if (drinks.some((d) => !!d.kidsTemp !== kidsTemp)) return null;
  const milkMl = drinks.reduce((sum, d) => sum + d.milkMl, 0);
  const steamFor = drinks.map((d) => d.texture as SteamedTexture).reduce(foamier);
  const pitcher = pitcherFor(milkMl, steamFor, rules);
  if (!pitcher && drinks.length > 1) return null;
  const chosen = pitcher ?? bySize(rules.pitchers)[rules.pitchers.length - 1];
  const coldMl = coldFor(chosen, milkMl, rules);
  return {
    jugId: null,
    pitcher: chosen,
    coldMl,
    wasteMl: coldMl - milkMl,
    steamFor,
    ...(kidsTemp ? { kidsTemp } : {}),
    fits: !!pitcher,
    drinkIds: pourOrder(drinks).map((d) => d.id),
  };
}

/** Thinnest first, then in the order given (oldest first). */
export function pourOrder<T extends JugDrink>(drinks: T[]): T[] {
  const thick = (d: JugDrink) => THICKNESS[d.texture as SteamedTexture];
  return drinks
    .map((d, age) => ({ d, age }))
    .sort((a, b) => thick(a.d) - thick(b.d) || a.age - b.age)
    .map(({ d }) => d);
}

/** `drinks` must be in the lane's order (oldest first) and not in a started jug. */
export function planJugs(drinks: JugDrink[], rules: JugRules): Jug[] {
  const steamed = drinks.filter(needsJug);
  if (steamed.length === 0 || rules.pitchers.length === 0) return [];
  const jugs: JugDrink[][] = [];
  let current: JugDrink[] = [];
  for (const d of steamed) {
    // the next drink joins only if the jug with it is still one jug by every rule
    if (current.length > 0 && !makeJug([...current, d], rules)) {
      jugs.push(current);
      current = [];
    }
    current.push(d);
  }
  jugs.push(current);
  return jugs.map((j) => makeJug(j, rules)!);
}

/**
 * The texture in the words baristas use at the wand: how long the milk is stretched (air let in)
 * and what foam that makes — wet and thin for a flat white, dry and thick for a cappuccino.
 */
export const STRETCH: Record<SteamedTexture, string> = {
  flat: 'short stretch (wet)',
  silky: 'medium stretch (silky)',
  foamy: 'long stretch (dry)',
};

/**
 * "600 ml pitcher · fill to 340 ml (15 ml waste) · 3 drinks · medium stretch (silky)", in the
 * café's unit. "Fill" is the pitcher's cold milk; "pour" is kept for the cups.
 */
export function describeJug(b: Jug, unit: VolumeUnit = 'ml'): string {
  const v = (ml: number) => cupSizeLabel(ml, unit);
  // pitchers are sold by the whole ounce (12, 20, 32 oz); the fill is read to the half ounce
  const pitcher = unit === 'ml' ? v(b.pitcher.capacityMl) : `${Math.round(mlToUsFlOz(b.pitcher.capacityMl))} oz`;
  const n = b.drinkIds.length;
  const waste = b.wasteMl > 0 ? ` (${v(b.wasteMl)} waste)` : '';
  const over = b.fits ? '' : ' · too much for one pitcher: steam it in two goes';
  const kids = b.kidsTemp ? ` · kids' temperature: stop at about ${KIDS_TEMP_C} °C / ${Math.round(celsiusToFahrenheit(KIDS_TEMP_C))} °F` : '';
  return `${pitcher} pitcher · fill to ${v(b.coldMl)}${waste} · ${n} drink${n === 1 ? '' : 's'} · ${STRETCH[b.steamFor]}${kids}${over}`;
}
