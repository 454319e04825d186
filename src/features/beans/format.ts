// How the Beans screen writes weights, dates and the run-out estimate.
import { runsOutPhrase, type RunsOut } from '@/domain/bean-stock';
import { keepUnits } from '@/lib/keep-units';

/** "1,000 g" with a no-break space: a weight never wraps between number and unit. */
export const gramsText = (dg: number, locale = 'en-US') => `${new Intl.NumberFormat(locale, { maximumFractionDigits: 0 }).format(Math.round(dg / 10))}\u00a0g`;

/** A café-local calendar date as "Thu 5 Mar". */
export function dateText(date: string, locale = 'en-US') {
  return new Intl.DateTimeFormat(locale, { weekday: 'short', day: 'numeric', month: 'short', timeZone: 'UTC' }).format(new Date(`${date}T00:00:00Z`));
}

/** "around Thu 5 Mar" from the daily pace; "in about 6 h of service" from a shift's. */
export function runsOutText(r: RunsOut, timeZone: string, locale = 'en-US'): { main: string; hint: string } {
  if (r.basis === 'empty') return { main: 'Empty', hint: 'nothing left' };
  if (r.basis === 'none') return { main: '—', hint: 'not enough use yet' };
  if (r.basis === 'days') {
    const day = new Intl.DateTimeFormat(locale, { weekday: 'short', day: 'numeric', month: 'short', timeZone }).format(new Date(r.at));
    return { main: `around ${day}`, hint: `${runsOutPhrase(r)}, at ${gramsText(r.perDayDg, locale)} a day (last ${r.days} ${r.days === 1 ? 'day' : 'days'})` };
  }
  return { main: keepUnits(runsOutPhrase(r)), hint: `at this shift's pace, ${gramsText(r.perHourDg, locale)} an hour` };
}
