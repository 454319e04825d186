// A bean lot's age and freshness. Ages are counted in the café's own calendar days: a roast date
// is a date on the roaster's bag, not an instant, so "days since roast" is the number of midnights
// the café has passed since then — 24-hour blocks would be off by one across a DST change or at
// the wrong hour of the day.
import { businessDate } from './business-date';

/** The freshness window, in days since roast. Editable per lot. */
export interface FreshnessWindow {
  /** Under this the beans are still resting (degassing CO₂). */
  restDays: number;
  /** Over this the aromatics are fading. */
  bestUntilDays: number;
}

/** Common practice: beans are at their best about 5–30 days after roasting. */
export const DEFAULT_FRESHNESS: FreshnessWindow = { restDays: 5, bestUntilDays: 30 };

export const FRESHNESS_STATES = ['resting', 'best', 'fading'] as const;
export type FreshnessState = (typeof FRESHNESS_STATES)[number];

export const FRESHNESS_LABEL: Record<FreshnessState, string> = { resting: 'Resting', best: 'Best', fading: 'Fading' };

const dayNumber = (date: string) => {
  const [y, m, d] = date.split('-').map(Number);
  return Date.UTC(y, m - 1, d) / 86_400_000;
};

/** Calendar days from one date to another (negative when `to` is earlier). */
export function daysBetween(from: string, to: string): number {
  return Math.round(dayNumber(to) - dayNumber(from));
}

export function addDays(date: string, days: number): string {
  return new Date((dayNumber(date) + days) * 86_400_000).toISOString().slice(0, 10);
}

export function daysSinceRoast(roastDate: string, now: Date, timeZone: string): number {
  return daysBetween(roastDate, businessDate(now, timeZone));
}

/** Resting under `restDays`, best from `restDays` to `bestUntilDays` (both included), fading after. */
export function freshnessState(days: number, window: FreshnessWindow = DEFAULT_FRESHNESS): FreshnessState {
  if (days < window.restDays) return 'resting';
  if (days <= window.bestUntilDays) return 'best';
  return 'fading';
}

export interface Freshness {
  daysSinceRoast: number;
  state: FreshnessState;
  /** First and last day of the best window, as café-local dates. */
  bestFrom: string;
  bestUntil: string;
}

export function freshnessOf(roastDate: string, now: Date, timeZone: string, window: FreshnessWindow = DEFAULT_FRESHNESS): Freshness {
  const days = daysSinceRoast(roastDate, now, timeZone);
  return {
    daysSinceRoast: days,
    state: freshnessState(days, window),
    bestFrom: addDays(roastDate, window.restDays),
    bestUntil: addDays(roastDate, window.bestUntilDays),
  };
}
