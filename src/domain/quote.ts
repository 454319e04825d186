// The wait the Counter quotes: the drinks ahead plus this order's, at the bar's recent pace.
// By Little's law (L = λW, docs/check-values.md) N drinks clear in N over the bar's throughput,
// and a bar of c baristas finishes c drinks per mean make time (busyPace in ./make-times.ts: the
// barista-time the bar was busy over the drinks it bumped, never the start taps).
import type { BarPace } from './make-times';

/** With no recent history, assume a drink a minute per barista (common practice, rough). */
export const DEFAULT_MAKE_SECONDS = 60;
/**
 * The default counts as this many drinks beside the measured ones: after two or three bumps the
 * quote is not yet the pace of those alone (a first jug can read very fast or very slow), and
 * after twenty it is nearly all measured.
 */
export const DEFAULT_WEIGHT_DRINKS = 5;

export interface QuoteInput {
  /** Bar drinks already queued or being made. */
  drinksAhead: number;
  /** Bar drinks in the new order. */
  drinksInOrder: number;
  baristas: number;
  /** The recent pace (busyPace over the last 30 minutes). */
  pace: BarPace;
}

/** Mean make time per drink per barista in seconds: the measured pace, steadied by the default. */
export const meanMakeSeconds = (pace: BarPace) => (pace.totalMs / 1000 + DEFAULT_WEIGHT_DRINKS * DEFAULT_MAKE_SECONDS) / (pace.drinks + DEFAULT_WEIGHT_DRINKS);

/**
 * The order is ready when the last of its drinks is: the drinks ahead and its own shared among the
 * baristas, and never less than one drink's make time (one barista makes one drink).
 */
export function quoteWaitSeconds({ drinksAhead, drinksInOrder, baristas, pace }: QuoteInput): number {
  if (drinksInOrder === 0) return 0;
  const drinks = drinksAhead + drinksInOrder;
  return Math.round(meanMakeSeconds(pace) * Math.max(1, drinks / Math.max(1, baristas)));
}

/** "About 4 min" — what the cashier tells the customer, rounded up to the minute so the promise is kept more often than not. */
export function quoteLabel(seconds: number): string {
  if (seconds <= 0) return 'Ready now';
  return `About ${Math.max(1, Math.ceil(seconds / 60))} min`;
}
