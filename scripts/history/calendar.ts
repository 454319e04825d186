// Café-local calendar dates ('YYYY-MM-DD') and local clock times turned into UTC instants.
import { businessDate } from '@/domain/business-date';

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

const formats = new Map<string, Intl.DateTimeFormat>();

/** How far the zone's wall clock is ahead of UTC at that instant, in ms. */
function zoneOffsetMs(utcMs: number, timeZone: string): number {
  let format = formats.get(timeZone);
  if (!format) {
    format = new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: 'numeric',
      day: 'numeric',
      hour: 'numeric',
      minute: 'numeric',
      second: 'numeric',
    });
    formats.set(timeZone, format);
  }
  const p = Object.fromEntries(format.formatToParts(new Date(utcMs)).map((x) => [x.type, x.value]));
  const wall = Date.UTC(Number(p.year), Number(p.month) - 1, Number(p.day), Number(p.hour), Number(p.minute), Number(p.second));
  return wall - Math.floor(utcMs / 1000) * 1000;
}

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
