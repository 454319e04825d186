// Café-local calendar dates ('YYYY-MM-DD') and local clock times turned into UTC instants.
import { businessDate } from '@/domain/business-date';
import { offsetMinutes } from '@server/reports/local-hours';

export { businessDate };

const DAY_MS = 86_400_000;

export function addDays(date: string, days: number): string {
  const [y, m, d] = date.split('-').map(Number);
  return new Date(Date.UTC(y, m - 1, d) + days * DAY_MS).toISOString().slice(0, 10);
}

/** 0 = Sunday … 6 = Saturday. */
export function weekday(date: string): number {
  const [y, m, d] = date.split('-').map(Number);
  return new Date(Date.UTC(y, m - 1, d)).getUTCDay();
}

/** The last `count` café days before the café-local date of `now`, oldest first. */
export function daysEndingYesterday(now: Date, timeZone: string, count: number): string[] {
  const today = businessDate(now, timeZone);
  return Array.from({ length: count }, (_, i) => addDays(today, i - count));
}

/** How far the zone's wall clock is ahead of UTC at that instant, in ms (the reports' own reading). */
const zoneOffsetMs = (utcMs: number, timeZone: string) => offsetMinutes(utcMs, timeZone) * 60_000;

/**
 * The UTC instant (ms) of the café's local midnight as its daytime clock reads it: add a number of
 * seconds after midnight to get any time from the small hours to the end of the day. Taken at local
 * noon, so a daylight-saving change (at 02:00 in the Americas) falls outside opening hours.
 */
export function localDayStartMs(date: string, timeZone: string): number {
  const [y, m, d] = date.split('-').map(Number);
  const noonWall = Date.UTC(y, m - 1, d, 12);
  let utc = noonWall - zoneOffsetMs(noonWall, timeZone);
  utc = noonWall - zoneOffsetMs(utc, timeZone);
  return utc - 12 * 3_600_000;
}

export const iso = (ms: number) => new Date(ms).toISOString();
