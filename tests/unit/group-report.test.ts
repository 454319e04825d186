// The group's report picks each café's figures out of its own range report and sums them only
// where a sum means something: money in one currency, counts. Percentile waits are never summed
// (a median of medians is not the group's median: common practice in descriptive statistics).
import { describe, expect, it } from 'vitest';
import { groupReportView, groupTotals, type GroupCafeRow } from '@/domain/group-report';
import type { ReportView } from '@/domain/reports';
import type { WaitSummary } from '@/domain/stats';

const waits = (medianSeconds: number | null): WaitSummary => ({
  count: medianSeconds === null ? 0 : 3,
  meanSeconds: medianSeconds,
  medianSeconds,
  p90Seconds: medianSeconds === null ? null : medianSeconds * 2,
  maxSeconds: medianSeconds === null ? null : medianSeconds * 3,
  overTargetShare: medianSeconds === null ? null : 1 / 3,
});

/** The parts of a ReportView the group report reads; the rest is there only for the type. */
function report(over: Partial<ReportView>): ReportView {
  return {
    period: { kind: 'range', from: '2026-03-02', to: '2026-03-03' },
    currency: 'USD',
    locale: 'en-US',
    timeZone: 'America/New_York',
    targetSeconds: 240,
    orders: 0,
    drinks: 0,
    grossCents: 0,
    taxCents: 0,
    discountCents: 0,
    refundsCents: 0,
    netCents: 0,
    tips: { cents: 0, cashCents: 0, cardCents: 0 },
    remakes: { count: 0, doseDg: 0, milkMl: 0, byReason: [] },
    paymentMix: { cash: { orders: 0, cents: 0 }, card: { orders: 0, cents: 0 } },
    waits: waits(null),
    overTarget: [],
    milkUsedMl: [],
    shotsPulled: 0,
    coffeeUsedDg: 0,
    topItems: [],
    hourly: [],
    ...over,
  };
}

const harbour = { id: 1, name: 'Harbour & Hearth Coffee' };
const ropewalk = { id: 2, name: 'Ropewalk Coffee Bar' };

describe('groupReportView', () => {
  it('gives each café its own report’s figures, in the order given, and sums money and counts', () => {
    const view = groupReportView('2026-03-02', '2026-03-03', [
      {
        cafe: harbour,
        report: report({
          orders: 5,
          drinks: 7,
          grossCents: 30_45,
          refundsCents: 1_50,
          netCents: 28_95,
          tips: { cents: 4_35, cashCents: 1_00, cardCents: 3_35 },
          waits: waits(200),
          targetSeconds: 240,
        }),
      },
      {
        cafe: ropewalk,
        report: report({
          orders: 2,
          drinks: 3,
          grossCents: 12_00,
          refundsCents: 0,
          netCents: 12_00,
          tips: { cents: 1_80, cashCents: 1_80, cardCents: 0 },
          waits: waits(90),
          targetSeconds: 300,
        }),
      },
    ]);
    expect(view).toEqual({
      from: '2026-03-02',
      to: '2026-03-03',
      cafes: [
        {
          ...harbour,
          currency: 'USD',
          locale: 'en-US',
          orders: 5,
          drinks: 7,
          grossCents: 30_45,
          refundsCents: 1_50,
          netCents: 28_95,
          tips: { cents: 4_35, cashCents: 1_00, cardCents: 3_35 },
          waits: waits(200),
          targetSeconds: 240,
        },
        {
          ...ropewalk,
          currency: 'USD',
          locale: 'en-US',
          orders: 2,
          drinks: 3,
          grossCents: 12_00,
          refundsCents: 0,
          netCents: 12_00,
          tips: { cents: 1_80, cashCents: 1_80, cardCents: 0 },
          waits: waits(90),
          targetSeconds: 300,
        },
      ],
      // 30.45 + 12.00 = 42.45; 28.95 + 12.00 = 40.95; tips 4.35 + 1.80 = 6.15, cash 1.00 + 1.80 = 2.80 (by hand)
      totals: {
        currency: 'USD',
        orders: 7,
        drinks: 10,
        grossCents: 42_45,
        refundsCents: 1_50,
        netCents: 40_95,
        tips: { cents: 6_15, cashCents: 2_80, cardCents: 3_35 },
      },
    });
  });

  it('keeps a café with no orders as a row of zeros and no waits', () => {
    const view = groupReportView('2026-03-02', '2026-03-02', [{ cafe: ropewalk, report: report({}) }]);
    expect(view.cafes[0]).toMatchObject({ orders: 0, netCents: 0, waits: { count: 0, medianSeconds: null, overTargetShare: null } });
    expect(view.totals).toMatchObject({ orders: 0, netCents: 0, tips: { cents: 0, cashCents: 0, cardCents: 0 } });
  });
});

describe('groupTotals', () => {
  const row = (currency: string, netCents: number): GroupCafeRow => ({
    ...harbour,
    currency,
    locale: 'en-US',
    orders: 1,
    drinks: 1,
    grossCents: netCents,
    refundsCents: 0,
    netCents,
    tips: { cents: 50, cashCents: 50, cardCents: 0 },
    waits: waits(60),
    targetSeconds: 240,
  });

  it('is null when the cafés take different currencies: dollars and euros (and their tips) don’t add up', () => {
    expect(groupTotals([row('USD', 5_00), row('EUR', 5_00)])).toBeNull();
  });

  it('is null for no café at all, and carries no wait figure', () => {
    expect(groupTotals([])).toBeNull();
    expect(Object.keys(groupTotals([row('EUR', 3_20)])!)).not.toContain('waits');
  });
});
