// An instant as a café's wall clock reads it: date, 24-hour time and the zone's offset, by Intl.
// One formatter per zone: reports and ticket CSVs read it for every row, and building an
// Intl.DateTimeFormat costs far more than using one.
const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
      timeZoneName: 'longOffset',
    });
    formatters.set(timeZone, f);
  }
  return f;
}

export interface WallClock {
  year: string;
  month: string;
  day: string;
  hour: string;
  minute: string;
  second: string;
  /** "GMT-05:00", or "GMT" for UTC itself */
  timeZoneName: string;
}

/** The wall clock's fields at `at` in `timeZone`, each as Intl writes it (two digits but the year). */
export function wallClock(at: Date, timeZone: string): WallClock {
  return Object.fromEntries(
    formatterFor(timeZone)
      .formatToParts(at)
      .map((p) => [p.type, p.value]),
  ) as unknown as WallClock;
}
