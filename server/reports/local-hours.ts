// The café-local hour of a stored UTC timestamp, computed inside the database. SQLite knows no time
// zones, so the zone's UTC offsets over the period (one per stretch between daylight-saving
// changes) are worked out here with Intl and handed to strftime as '+N minutes' modifiers (on
// PostgreSQL, the same text as an interval: one SQL for both, server/db/dialect.ts).
import { addDays } from '@/domain/freshness';
import { wallClock } from '@/domain/wall-clock';
import { type Dialect, shiftedHourSql } from '@server/db/dialect';

/** The zone's offset from UTC at `ms`, in whole minutes (New York in winter: −300). */
export function offsetMinutes(ms: number, timeZone: string): number {
  const p = wallClock(new Date(ms), timeZone);
  const wall = Date.UTC(+p.year, +p.month - 1, +p.day, +p.hour, +p.minute, +p.second);
  return Math.round((wall - Math.floor(ms / 1000) * 1000) / 60_000);
}

/** The instants [start, end) of a café-local date: its midnight to the next, across any clock change. */
export function dayBounds(date: string, timeZone: string): [number, number] {
  const midnight = (d: string) => {
    const wall = Date.parse(`${d}T00:00:00Z`);
    const guess = wall - offsetMinutes(wall, timeZone) * 60_000;
    return wall - offsetMinutes(guess, timeZone) * 60_000;
  };
  return [midnight(date), midnight(addDays(date, 1))];
}

/** The café-local hour (0–23) of an instant. */
export const localHour = (ms: number, timeZone: string) => new Date(ms + offsetMinutes(ms, timeZone) * 60_000).getUTCHours();

export interface OffsetStretch {
  /** first instant (ms) of the stretch */
  startMs: number;
  offsetMinutes: number;
}

const DAY = 86_400_000;

/** The stretches of constant offset between two instants, found day by day, then to the millisecond. */
export function offsetStretches(fromMs: number, toMs: number, timeZone: string): OffsetStretch[] {
  const stretches: OffsetStretch[] = [{ startMs: fromMs, offsetMinutes: offsetMinutes(fromMs, timeZone) }];
  for (let t = fromMs; t < toMs; t += DAY) {
    const next = Math.min(t + DAY, toMs);
    const current = stretches[stretches.length - 1].offsetMinutes;
    const after = offsetMinutes(next, timeZone);
    if (after === current) continue;
    let lo = t; // offset is `current` at lo, `after` at hi
    let hi = next;
    while (hi - lo > 1) {
      const mid = Math.floor((lo + hi) / 2);
      if (offsetMinutes(mid, timeZone) === current) lo = mid;
      else hi = mid;
    }
    stretches.push({ startMs: hi, offsetMinutes: after });
  }
  return stretches;
}

/**
 * SQL for the café-local hour (0–23) of `column`, exact for timestamps between fromMs and toMs.
 * Every timestamp is stored as toISOString() writes it, so text comparison is time comparison.
 */
export function localHourSql(d: Dialect, column: string, fromMs: number, toMs: number, timeZone: string): { sql: string; bindings: string[] } {
  const stretches = offsetStretches(fromMs, toMs, timeZone);
  const modifier = (m: number) => `${m >= 0 ? '+' : ''}${m} minutes`;
  if (stretches.length === 1) {
    return { sql: shiftedHourSql(d, column, '?'), bindings: [modifier(stretches[0].offsetMinutes)] };
  }
  const whens = stretches
    .slice(1)
    .map(() => `WHEN ${column} < ? THEN ?`)
    .join(' ');
  const bindings: string[] = [];
  stretches.slice(1).forEach((s, i) => bindings.push(new Date(s.startMs).toISOString(), modifier(stretches[i].offsetMinutes)));
  bindings.push(modifier(stretches[stretches.length - 1].offsetMinutes));
  return { sql: shiftedHourSql(d, column, `CASE ${whens} ELSE ? END`), bindings };
}
