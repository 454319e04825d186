// Day by day: a row per date of the range, a date without orders as zeros, each row merged from
// its own day alone and the total from the whole range (so the total's median is the range's
// median, not a median of the days' medians: common practice in descriptive statistics); the CSV
// writes money as decimal amounts and guards its text cells as the other downloads do.
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { dayFigures, daysInRange, MAX_REPORT_DAYS, type ReportDaysView } from '@/domain/report-days';
import { sumTips } from '@/domain/reports';
import { reportDaysQuery } from '@/domain/schemas';
import { dayByDay, emptyPartial, type DayPartial } from '@server/reports/days';
import { reportDaysCsv } from '@server/reports/csv';

const TZ = 'America/New_York';

/** A day's partial with its orders in one hour: [gross cents, cash?] per order, and its waits. */
function partial(orders: [number, boolean][], waits: number[], shots = 0): DayPartial {
  const p = emptyPartial(TZ);
  if (orders.length) {
    const gross = orders.reduce((a, [c]) => a + c, 0);
    const cash = orders.filter(([, isCash]) => isCash);
    // [hour, orders, gross, tax, discount, refunds, cashOrders, cashCents, drinks]
    p.hours = [[9, orders.length, gross, 0, 0, 0, cash.length, cash.reduce((a, [c]) => a + c, 0), orders.length]];
  }
  p.waits = waits;
  p.waitHours = waits.length ? [9, waits.length] : [];
  p.shots = shots;
  return p;
}

const zeros = {
  orders: 0,
  drinks: 0,
  grossCents: 0,
  taxCents: 0,
  discountCents: 0,
  refundsCents: 0,
  netCents: 0,
  tips: { cents: 0, cashCents: 0, cardCents: 0 },
  cashCents: 0,
  cardCents: 0,
  medianWaitSeconds: null,
  p90WaitSeconds: null,
  overTargetCount: 0,
  timedTickets: 0,
  shotsPulled: 0,
};

describe('daysInRange', () => {
  it('counts both ends, across a month and a leap day (by hand)', () => {
    expect(daysInRange('2026-03-01', '2026-03-01')).toBe(1);
    expect(daysInRange('2026-02-27', '2026-03-02')).toBe(4);
    expect(daysInRange('2028-01-01', '2028-12-31')).toBe(366);
    expect(daysInRange('2026-03-02', '2026-03-01')).toBe(0);
  });
});

describe('reportDaysQuery', () => {
  it(`takes up to ${MAX_REPORT_DAYS} days and refuses a longer range on "to"`, () => {
    expect(reportDaysQuery.safeParse({ from: '2028-01-01', to: '2028-12-31' }).success).toBe(true);
    const long = reportDaysQuery.safeParse({ from: '2027-01-01', to: '2028-01-02' });
    expect(long.success).toBe(false);
    expect(long.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([['to', `Pick at most ${MAX_REPORT_DAYS} days`]]);
  });

  it('refuses a reversed range once, as the range report does', () => {
    const reversed = reportDaysQuery.safeParse({ from: '2026-03-03', to: '2026-03-02' });
    expect(reversed.error?.issues.map((i) => i.message)).toEqual(['The range ends before it starts']);
  });
});

describe('dayByDay', () => {
  const dates = ['2026-03-01', '2026-03-02', '2026-03-03'];
  const parts = [
    partial(
      [
        [500, true],
        [700, false],
      ],
      [100, 300],
      3,
    ),
    emptyPartial(TZ),
    partial([[450, false]], [500], 2),
  ];
  // tips on the first and last dates only: a date without an entry had none
  const tips = new Map([
    ['2026-03-01', { cents: 1_25, cashCents: 75, cardCents: 50 }],
    ['2026-03-03', { cents: 2_00, cashCents: 0, cardCents: 2_00 }],
  ]);
  const { days, total } = dayByDay(parts, dates, 240, tips);

  it('gives every date a row, oldest first, a date without orders all zeros', () => {
    expect(days.map((d) => d.date)).toEqual(dates);
    expect(days[1]).toEqual({ date: '2026-03-02', ...zeros });
  });

  it("gives each row its own day's figures: money, cash and card, waits against the target", () => {
    // waits 100 and 300 s: median 200 (by hand), one of two over 240 s
    expect(days[0]).toMatchObject({ orders: 2, drinks: 2, grossCents: 1200, netCents: 1200, cashCents: 500, cardCents: 700 });
    expect(days[0]).toMatchObject({ medianWaitSeconds: 200, overTargetCount: 1, timedTickets: 2, shotsPulled: 3 });
    expect(days[2]).toMatchObject({ orders: 1, cashCents: 0, cardCents: 450, medianWaitSeconds: 500, overTargetCount: 1, timedTickets: 1 });
    expect(days.map((d) => d.tips)).toEqual([tips.get('2026-03-01'), { cents: 0, cashCents: 0, cardCents: 0 }, tips.get('2026-03-03')]);
  });

  it("totals the range as one: the sums of the rows, and the range's own median", () => {
    const sum = (k: 'orders' | 'grossCents' | 'cashCents' | 'cardCents' | 'overTargetCount' | 'timedTickets' | 'shotsPulled') =>
      days.reduce((a, d) => a + d[k], 0);
    expect(total).toMatchObject({
      orders: sum('orders'),
      grossCents: sum('grossCents'),
      cashCents: sum('cashCents'),
      cardCents: sum('cardCents'),
      overTargetCount: sum('overTargetCount'),
      timedTickets: sum('timedTickets'),
      shotsPulled: sum('shotsPulled'),
    });
    // 100, 300, 500 → 300; the days' medians (200, 500) would give 350
    expect(total.medianWaitSeconds).toBe(300);
    // 1.25 + 2.00 = 3.25; cash 0.75, card 0.50 + 2.00 = 2.50 (by hand)
    expect(total.tips).toEqual({ cents: 3_25, cashCents: 75, cardCents: 2_50 });
  });

  it('gives every row no tips when the range had none', () => {
    const none = dayByDay(parts, dates, 240);
    expect([...none.days.map((d) => d.tips), none.total.tips]).toEqual(Array(4).fill({ cents: 0, cashCents: 0, cardCents: 0 }));
  });
});

describe('sumTips', () => {
  it('adds total, cash and card separately; nothing to add is no tips', () => {
    expect(sumTips([])).toEqual({ cents: 0, cashCents: 0, cardCents: 0 });
    expect(
      sumTips([
        { cents: 3_10, cashCents: 1_10, cardCents: 2_00 },
        { cents: 45, cashCents: 45, cardCents: 0 },
      ]),
    ).toEqual({ cents: 3_55, cashCents: 1_55, cardCents: 2_00 });
  });
});

describe('dayFigures', () => {
  it('counts the tickets over target back from the share exactly, for any count', () => {
    const waits = { count: 7, meanSeconds: 1, medianSeconds: 1, p90Seconds: 1, maxSeconds: 1, overTargetShare: 3 / 7 };
    const mix = { cash: { orders: 0, cents: 0 }, card: { orders: 0, cents: 0 } };
    const tips = { cents: 0, cashCents: 0, cardCents: 0 };
    const base = { orders: 0, drinks: 0, grossCents: 0, taxCents: 0, discountCents: 0, refundsCents: 0, netCents: 0, tips, paymentMix: mix, shotsPulled: 0 };
    expect(dayFigures({ ...base, waits }).overTargetCount).toBe(3);
  });
});

describe('reportDaysCsv', () => {
  const view: ReportDaysView = {
    from: '2026-03-01',
    to: '2026-03-03',
    currency: 'USD',
    locale: 'en-US',
    timeZone: TZ,
    targetSeconds: 240,
    ...dayByDay(
      [
        partial([[1250, true]], [123.456]),
        emptyPartial(TZ),
        partial(
          [
            [0, true],
            [990, false],
          ],
          [],
        ),
      ],
      ['2026-03-01', '2026-03-02', '2026-03-03'],
      240,
      new Map([['2026-03-03', { cents: 1_49, cashCents: 0, cardCents: 1_49 }]]),
    ),
  };
  const rows = Papa.parse<string[]>(reportDaysCsv(view).trim()).data;

  it('has a header, a row per date and the total, money as decimal amounts in the currency', () => {
    expect(rows[0]).toEqual([
      'Date',
      'Orders',
      'Drinks',
      'Gross (USD)',
      'Tax (USD)',
      'Discounts (USD)',
      'Refunds (USD)',
      'Net (USD)',
      'Cash (USD)',
      'Card (USD)',
      'Tips (USD)',
      'Cash tips (USD)',
      'Card tips (USD)',
      'Median wait (s)',
      'p90 wait (s)',
      'Over 240 s target',
      'Tickets timed',
      'Shots pulled',
    ]);
    expect(rows.map((r) => r[0])).toEqual(['Date', '2026-03-01', '2026-03-02', '2026-03-03', 'Total']);
    expect(rows[1].slice(0, 4)).toEqual(['2026-03-01', '1', '1', '12.50']);
    expect(rows[1].slice(13, 15)).toEqual(['123.5', '123.5']);
    // no waits: empty cells, not zeros; no tips: zeros
    expect(rows[2]).toEqual(['2026-03-02', '0', '0', '0.00', '0.00', '0.00', '0.00', '0.00', '0.00', '0.00', '0.00', '0.00', '0.00', '', '', '0', '0', '0']);
    expect(rows[3].slice(10, 13)).toEqual(['1.49', '0.00', '1.49']);
    expect(rows[4].slice(10, 13)).toEqual(['1.49', '0.00', '1.49']);
    expect(rows[4].slice(0, 4)).toEqual(['Total', '3', '3', '22.40']);
  });

  it('quotes every cell with CRLF line ends, as the other CSV downloads', () => {
    const text = reportDaysCsv(view);
    expect(text.split('\r\n')).toHaveLength(5);
    expect(text.startsWith('"Date","Orders"')).toBe(true);
  });
});
