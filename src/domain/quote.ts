// The wait the Counter quotes: the drinks ahead plus this order's, at the bar's recent pace.
import { median } from './stats';

/** With no recent history, assume a drink a minute per barista (common practice, rough). */
export const DEFAULT_MAKE_SECONDS = 60;

export interface QuoteInput {
  /** Bar drinks already queued or being made. */
  drinksAhead: number;
  /** Bar drinks in the new order. */
  drinksInOrder: number;
  baristas: number;
  /** Recent make times per drink, in seconds (done − started). */
  recentMakeSeconds: number[];
}

export function quoteWaitSeconds({ drinksAhead, drinksInOrder, baristas, recentMakeSeconds }: QuoteInput): number {
  if (drinksInOrder === 0) return 0;
  const perDrink = recentMakeSeconds.length ? median(recentMakeSeconds) : DEFAULT_MAKE_SECONDS;
  return Math.round(((drinksAhead + drinksInOrder) * perDrink) / Math.max(1, baristas));
}

/** "About 4 min" — rounded up to the minute so the promise is kept more often than not. */
export function quoteLabel(seconds: number): string {
  if (seconds <= 0) return 'Ready now';
  return `About ${Math.max(1, Math.ceil(seconds / 60))} min`;
}
