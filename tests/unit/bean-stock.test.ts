// A lot's run-out estimate and stock warnings. Days of stock = what is left ÷ average use per day
// is the usual days-of-supply arithmetic of stock keeping (common practice, from memory); every
// expected value below is worked by hand in the comment beside it. Zone facts (from memory): New
// York is on EDT (UTC−4) from 8 March 2026; Auckland on NZDT (UTC+13) on 2 March 2026.
import { describe, expect, it } from 'vitest';
import { beanAlerts, drinkHopper, runsOut, runsOutPhrase, stockState, type BeanLotView, type UsePoint } from '@/domain/bean-stock';

const NY = 'America/New_York';
const NOW = new Date('2026-03-10T15:00:00Z'); // 11:00 EDT on Tuesday 10 March
const g = (grams: number) => grams * 10; // the domain counts tenths of a gram
const use = (at: string, grams: number): UsePoint => ({ at, doseDg: g(grams) });

describe('runsOut', () => {
  it('nothing left: empty; never used: no estimate', () => {
    expect(runsOut({ remainingDg: 0, uses: [use('2026-03-09T14:00:00Z', 19)], now: NOW, timeZone: NY, shiftStart: null })).toEqual({ basis: 'empty' });
    expect(runsOut({ remainingDg: g(1000), uses: [], now: NOW, timeZone: NY, shiftStart: null })).toEqual({ basis: 'none' });
  });

  it('a full week: the average of the last 7 café days, today left out', () => {
    // 1,000 g on each of 3–9 March, plus 2,000 g on 1 March (before the week) and 500 g so far today
    const uses = ['03', '04', '05', '06', '07', '08', '09'].map((d) => use(`2026-03-${d}T14:00:00Z`, 1000));
    uses.push(use('2026-03-01T14:00:00Z', 2000), use('2026-03-10T13:00:00Z', 500));
    const r = runsOut({ remainingDg: g(3500), uses, now: NOW, timeZone: NY, shiftStart: null });
    // 7 × 1,000 g ÷ 7 days = 1,000 g a day; 3,500 g ÷ 1,000 g = 3.5 days; 15:00Z + 84 h = 14 March 03:00Z
    expect(r).toEqual({ basis: 'days', days: 7, perDayDg: g(1000), daysLeft: 3.5, at: '2026-03-14T03:00:00.000Z' });
  });

  it('a lot opened two days ago: the average over those two days', () => {
    const uses = [use('2026-03-08T15:00:00Z', 600), use('2026-03-09T15:00:00Z', 1000), use('2026-03-10T14:00:00Z', 300)];
    const r = runsOut({ remainingDg: g(2000), uses, now: NOW, timeZone: NY, shiftStart: null });
    // (600 + 1,000) g ÷ 2 days = 800 g a day; 2,000 ÷ 800 = 2.5 days
    expect(r).toMatchObject({ basis: 'days', days: 2, perDayDg: g(800), daysLeft: 2.5 });
  });

  it('a closed day inside the week counts as a day with no use', () => {
    // used 4–9 March except Sunday 8 March: 5 × 840 g over 6 days = 700 g a day
    const uses = ['04', '05', '06', '07', '09'].map((d) => use(`2026-03-${d}T15:00:00Z`, 840));
    const r = runsOut({ remainingDg: g(1400), uses, now: NOW, timeZone: NY, shiftStart: null });
    expect(r).toMatchObject({ basis: 'days', days: 6, perDayDg: g(700), daysLeft: 2 }); // 1,400 ÷ 700 = 2
  });

  it('days are the café’s: in Auckland, 10:00Z on 2 March was yesterday evening', () => {
    const now = new Date('2026-03-02T11:30:00Z'); // 00:30 NZDT on 3 March
    const r = runsOut({ remainingDg: g(900), uses: [use('2026-03-02T10:00:00Z', 300)], now, timeZone: 'Pacific/Auckland', shiftStart: null });
    // one full local day (2 March) with 300 g; 900 ÷ 300 = 3 days
    expect(r).toMatchObject({ basis: 'days', days: 1, perDayDg: g(300), daysLeft: 3 });
    // in UTC the same use is "today", so there is no full day yet and no shift pace either (it is 1.5 h)
    expect(runsOut({ remainingDg: g(900), uses: [use('2026-03-02T10:00:00Z', 300)], now, timeZone: 'UTC', shiftStart: null }).basis).toBe('shift');
  });

  it('first day in use: this shift’s pace, in hours of service', () => {
    // shift opened 11:00Z; 40 doubles of 19 g = 760 g by 15:00Z → 760 g ÷ 4 h = 190 g/h
    const uses = Array.from({ length: 40 }, (_, i) => use(new Date(Date.parse('2026-03-10T11:05:00Z') + i * 5 * 60_000).toISOString(), 19));
    const r = runsOut({ remainingDg: g(1900), uses, now: NOW, timeZone: NY, shiftStart: '2026-03-10T11:00:00Z' });
    // 1,900 g ÷ 190 g/h = 10 h → 15:00Z + 10 h = 11 March 01:00Z
    expect(r).toEqual({ basis: 'shift', perHourDg: g(190), hoursLeft: 10, at: '2026-03-11T01:00:00.000Z' });
  });

  it('no shift open: the pace runs from the first use today', () => {
    const uses = [use('2026-03-10T13:00:00Z', 190), use('2026-03-10T14:00:00Z', 190)];
    // 380 g over 13:00–15:00Z = 190 g/h; 950 g ÷ 190 = 5 h
    expect(runsOut({ remainingDg: g(950), uses, now: NOW, timeZone: NY, shiftStart: null })).toMatchObject({ basis: 'shift', hoursLeft: 5 });
  });

  it('under 15 minutes of pace is too little to project', () => {
    const uses = [use('2026-03-10T14:50:00Z', 19)];
    expect(runsOut({ remainingDg: g(950), uses, now: NOW, timeZone: NY, shiftStart: null })).toEqual({ basis: 'none' });
  });
});

describe('stockState', () => {
  const days = (daysLeft: number) => ({ basis: 'days' as const, days: 7, perDayDg: g(1000), daysLeft, at: '' });
  it('empty, under the owner’s line, under a day of use, or fine', () => {
    expect(stockState(0, { basis: 'empty' }, 500)).toBe('empty');
    expect(stockState(-50, { basis: 'empty' }, 500)).toBe('empty');
    expect(stockState(g(499), { basis: 'none' }, 500)).toBe('low'); // under 500 g
    expect(stockState(g(500), { basis: 'none' }, 500)).toBe('ok'); // exactly the line is not under it
    expect(stockState(g(800), days(0.8), 500)).toBe('low'); // 800 g at 1,000 g a day: under a day
    expect(stockState(g(3500), days(3.5), 500)).toBe('ok');
    // a shift's pace alone does not make a lot low (a day's hours are not known)
    expect(stockState(g(600), { basis: 'shift', perHourDg: g(300), hoursLeft: 2, at: '' }, 500)).toBe('ok');
  });
});

describe('drinkHopper', () => {
  it('a decaf extra draws from the decaf grinder; anything else from the espresso grinder', () => {
    expect(drinkHopper(['Decaf'])).toBe('decaf');
    expect(drinkHopper(['Vanilla syrup', 'decaf'])).toBe('decaf');
    expect(drinkHopper(['Vanilla syrup'])).toBe('espresso');
    expect(drinkHopper([])).toBe('espresso');
  });
});

describe('beanAlerts and runsOutPhrase', () => {
  const lot = (over: Partial<BeanLotView>): BeanLotView => ({
    id: 1,
    name: 'Test Lot',
    roaster: 'R',
    origin: null,
    notes: null,
    roastDate: '2026-03-01',
    receivedDate: '2026-03-02',
    receivedG: 1000,
    hopper: 'espresso',
    restDays: 5,
    bestUntilDays: 30,
    retiredAt: null,
    daysSinceRoast: 10,
    freshness: 'best',
    usedDg: 0,
    remainingDg: g(1000),
    runsOut: { basis: 'none' },
    stock: 'ok',
    lastGood: null,
    ...over,
  });
  it('low or empty in a grinder, fading anywhere; nothing for a retired lot or a low one on the shelf', () => {
    const alerts = beanAlerts([
      lot({ id: 1, name: 'A', stock: 'low', remainingDg: g(420), runsOut: { basis: 'days', days: 7, perDayDg: g(1000), daysLeft: 0.42, at: '' } }),
      lot({ id: 2, name: 'B', hopper: 'decaf', stock: 'empty', remainingDg: 0 }),
      lot({ id: 3, name: 'C', hopper: 'shelf', freshness: 'fading', daysSinceRoast: 34 }),
      lot({ id: 4, name: 'D', hopper: 'shelf', stock: 'low' }),
      lot({ id: 5, name: 'E', freshness: 'fading', retiredAt: '2026-03-09T10:00:00Z' }),
    ]);
    expect(alerts.map((a) => [a.lotId, a.kind])).toEqual([
      [1, 'low'],
      [2, 'empty'],
      [3, 'fading'],
    ]);
    expect(alerts[0].message).toBe('A in the espresso grinder is low: 420 g left; runs out in about 0.4 days');
    expect(alerts[2].message).toBe('C on the shelf is past its best: 34 days since roast');
  });
  it('phrases', () => {
    expect(runsOutPhrase({ basis: 'days', days: 7, perDayDg: 1, daysLeft: 3.46, at: '' })).toBe('in about 3.5 days');
    expect(runsOutPhrase({ basis: 'days', days: 7, perDayDg: 1, daysLeft: 12.6, at: '' })).toBe('in about 13 days');
    expect(runsOutPhrase({ basis: 'shift', perHourDg: 1, hoursLeft: 2.25, at: '' })).toBe('in about 2.3 h of service');
  });
});
