// The wait the Counter quotes: the drinks ahead plus this order's, at the bar's recent pace.
// By Little's law (L = λW, docs/check-values.md) N drinks clear in N over the bar's throughput,
// and a bar of c baristas finishes c drinks per MEAN make time — a batch's time shared among its
// drinks (./make-times.ts).
import type { BarPace } from './make-times';

/** With no recent history, assume a drink a minute per barista (common practice, rough). */
export const DEFAULT_MAKE_SECONDS = 60;

export interface QuoteInput {
  /** Bar drinks already queued or being made. */
  drinksAhead: number;
  /** Bar drinks in the new order. */
  drinksInOrder: number;
  baristas: number;
  /** The recent pace (barPace over the last drinks bumped). */
  pace: BarPace;
}

/** Mean make time per drink in seconds, or the default with nothing timed. */
export const meanMakeSeconds = (pace: BarPace) => (pace.drinks > 0 ? pace.totalMs / 1000 / pace.drinks : DEFAULT_MAKE_SECONDS);

export function quoteWaitSeconds({ drinksAhead, drinksInOrder, baristas, pace }: QuoteInput): number {
  if (drinksInOrder === 0) return 0;
  return Math.round(((drinksAhead + drinksInOrder) * meanMakeSeconds(pace)) / Math.max(1, baristas));
}

/** "About 4 min" — what the cashier tells the customer, rounded up to the minute so the promise is kept more often than not. */
export function quoteLabel(seconds: number): string {
  if (seconds <= 0) return 'Ready now';
  return `About ${Math.max(1, Math.ceil(seconds / 60))} min`;
}
