// Days since roast, counted in the café's calendar days, and the freshness window.
// Calendar facts used below (from memory, not read in a stored copy):
// - Gregorian leap years: divisible by 4, except centuries not divisible by 400 — 2028 is a leap
//   year (29 February exists), 2027 is not.
// - US daylight saving time (Energy Policy Act of 2005): from the second Sunday of March at 02:00
//   local to the first Sunday of November at 02:00 local; in 2026 on 8 March and 1 November.
//   Los Angeles: PST = UTC−8, PDT = UTC−7.
// - EU summer time (Directive 2000/84/EC), followed by the UK: from the last Sunday of March to the
//   last Sunday of October, changing at 01:00 UTC; in 2026 on 29 March and 25 October. London:
//   GMT = UTC+0, BST = UTC+1.
// - New Zealand daylight time (Daylight Time Order 2007): from the last Sunday of September to the
//   first Sunday of April; on 2 March 2026 Auckland is on NZDT = UTC+13.
// The freshness window itself (resting under 5 days, best to 30, fading after) is common practice
// (check-values.md: "beans at their best about 5–30 days after roasting").
import { describe, expect, it } from 'vitest';
import { addDays, daysBetween, daysSinceRoast, DEFAULT_FRESHNESS, freshnessOf, freshnessState } from '@/domain/freshness';
import { businessDate } from '@/domain/business-date';

const at = (iso: string) => new Date(iso);

describe('businessDate: the calendar date of an instant in a zone', () => {
  it('Auckland is already on the next day when UTC is not (NZDT, UTC+13)', () => {
    // 2026-03-02T11:30Z + 13 h = 2026-03-03 00:30 local
    expect(businessDate(at('2026-03-02T11:30:00Z'), 'Pacific/Auckland')).toBe('2026-03-03');
    // one minute before local midnight: 10:59Z + 13 h = 23:59 on the 2nd
    expect(businessDate(at('2026-03-02T10:59:00Z'), 'Pacific/Auckland')).toBe('2026-03-02');
    expect(businessDate(at('2026-03-02T11:30:00Z'), 'UTC')).toBe('2026-03-02');
  });
  it('London on BST is an hour ahead of UTC around midnight', () => {
    // after the 29 March 2026 change: 23:30Z is 00:30 BST on the 30th
    expect(businessDate(at('2026-03-29T23:30:00Z'), 'Europe/London')).toBe('2026-03-30');
    // before the 25 October 2026 change (01:00Z): 2026-10-24T23:30Z is 00:30 BST on the 25th
    expect(businessDate(at('2026-10-24T23:30:00Z'), 'Europe/London')).toBe('2026-10-25');
    // after it, on GMT: 23:30Z is 23:30 on the same day
    expect(businessDate(at('2026-10-25T23:30:00Z'), 'Europe/London')).toBe('2026-10-25');
  });
});

describe('daysBetween and addDays count calendar days', () => {
  it('across month ends, leap days and the year end', () => {
    expect(daysBetween('2026-01-31', '2026-02-01')).toBe(1); // Jan 31 → Feb 1
    expect(daysBetween('2028-02-28', '2028-03-01')).toBe(2); // 2028 is a leap year: Feb 29 between
    expect(daysBetween('2027-02-28', '2027-03-01')).toBe(1); // 2027 is not
    expect(daysBetween('2028-02-28', '2028-02-29')).toBe(1);
    expect(daysBetween('2026-12-31', '2027-01-01')).toBe(1); // year end
    expect(daysBetween('2026-03-02', '2026-03-01')).toBe(-1);
    expect(addDays('2028-02-28', 1)).toBe('2028-02-29');
    expect(addDays('2027-02-28', 1)).toBe('2027-03-01');
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01');
    expect(addDays('2026-03-01', -1)).toBe('2026-02-28');
  });
});

describe('daysSinceRoast', () => {
  it('counts midnights in the café zone, not 24-hour blocks, when the clocks spring forward (Los Angeles, 8 March 2026)', () => {
    // roasted 7 March; at 2026-03-09T07:30Z it is 00:30 PDT on 9 March: two days, although only
    // 47.5 hours have passed since local midnight on the 7th (08:00Z, PST)
    expect(daysSinceRoast('2026-03-07', at('2026-03-09T07:30:00Z'), 'America/Los_Angeles')).toBe(2);
    // at 06:59Z it is 23:59 PDT, still 8 March: one day
    expect(daysSinceRoast('2026-03-07', at('2026-03-09T06:59:00Z'), 'America/Los_Angeles')).toBe(1);
  });
  it('…and when they fall back (Los Angeles, 1 November 2026)', () => {
    // roasted 31 October; 2026-11-02T07:30Z is 23:30 PST on 1 November: one day, although 48.5 h
    // have passed since local midnight on the 31st (07:00Z, PDT)
    expect(daysSinceRoast('2026-10-31', at('2026-11-02T07:30:00Z'), 'America/Los_Angeles')).toBe(1);
    expect(daysSinceRoast('2026-10-31', at('2026-11-02T08:00:00Z'), 'America/Los_Angeles')).toBe(2); // 00:00 PST on the 2nd
  });
  it('London across the spring change: local date, not the UTC date', () => {
    // 2026-03-29T23:30Z is 30 March in London, so a 28 March roast is 2 days old (the UTC date gives 1)
    expect(daysSinceRoast('2026-03-28', at('2026-03-29T23:30:00Z'), 'Europe/London')).toBe(2);
    expect(daysSinceRoast('2026-03-28', at('2026-03-29T23:30:00Z'), 'UTC')).toBe(1);
  });
  it('Auckland at 2026-03-02T11:30Z: the café is on 3 March', () => {
    expect(daysSinceRoast('2026-02-26', at('2026-03-02T11:30:00Z'), 'Pacific/Auckland')).toBe(5); // Feb 26 → Mar 3 in 2026: 28 days in Feb
    expect(daysSinceRoast('2026-02-26', at('2026-03-02T11:30:00Z'), 'UTC')).toBe(4);
  });
  it('across the year end and a leap day', () => {
    expect(daysSinceRoast('2026-12-28', at('2027-01-02T15:00:00Z'), 'America/New_York')).toBe(5);
    expect(daysSinceRoast('2028-02-01', at('2028-03-02T17:00:00Z'), 'America/New_York')).toBe(30); // Feb 2028 has 29 days
  });
});

describe('freshnessState: resting under 5 days, best 5–30, fading after (common practice)', () => {
  const cases: [number, string][] = [
    [0, 'resting'],
    [4, 'resting'],
    [5, 'best'], // the first best day
    [17, 'best'],
    [30, 'best'], // the last best day
    [31, 'fading'],
    [90, 'fading'],
  ];
  it.each(cases)('day %i is %s', (days, state) => {
    expect(freshnessState(days)).toBe(state);
  });
  it('a lot with its own window (a filter roast resting 3 days, best to 21)', () => {
    const w = { restDays: 3, bestUntilDays: 21 };
    expect([2, 3, 21, 22].map((d) => freshnessState(d, w))).toEqual(['resting', 'best', 'best', 'fading']);
  });
  it('the defaults are the common-practice 5 and 30', () => {
    expect(DEFAULT_FRESHNESS).toEqual({ restDays: 5, bestUntilDays: 30 });
  });
});

describe('freshnessOf', () => {
  it('the day count, the state and the best window as dates', () => {
    // roasted 27 January 2028: day 5 is 1 February, day 30 is 26 February
    expect(freshnessOf('2028-01-27', at('2028-02-01T14:00:00Z'), 'Europe/London')).toEqual({
      daysSinceRoast: 5,
      state: 'best',
      bestFrom: '2028-02-01',
      bestUntil: '2028-02-26',
    });
    // 30 days after 31 January 2028 is 1 March (29 days in February 2028)
    expect(freshnessOf('2028-01-31', at('2028-03-01T12:00:00Z'), 'UTC')).toMatchObject({ daysSinceRoast: 30, state: 'best', bestUntil: '2028-03-01' });
    expect(freshnessOf('2028-01-31', at('2028-03-02T12:00:00Z'), 'UTC').state).toBe('fading');
  });
});
