// The café's own calendar date of an instant, YYYY-MM-DD in its time zone: the day an order is
// numbered and reported under, and the day bean ages are counted in.
// Making an Intl.DateTimeFormat costs ~30× a format() with it, and reports call this per row.
const formats = new Map<string, Intl.DateTimeFormat>();

/** The calendar date (YYYY-MM-DD) `at` falls on in `timeZone`. */
export function businessDate(at: Date, timeZone: string): string {
  let format = formats.get(timeZone);
  if (!format) {
    // en-CA writes dates as YYYY-MM-DD
    format = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' });
    formats.set(timeZone, format);
  }
  return format.format(at);
}
