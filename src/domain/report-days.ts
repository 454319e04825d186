// Day by day: a range of café-local dates with one row per date, each row the figures of that
// date's own range report, and the whole range's figures below them. Nothing here counts an order:
// it only picks figures out of reports (server/reports/report-days.ts makes them).
import type { ReportView } from './reports';

/** The most dates one day-by-day answer covers: a year, a leap day included. */
export const MAX_REPORT_DAYS = 366;

/** The figures of one date's (or the whole range's) report that a day's row shows: the report's
 * own counts and money as they are, and the rest flattened for a table row and the CSV. */
export interface DayFigures extends Pick<ReportView, 'orders' | 'drinks' | 'grossCents' | 'taxCents' | 'discountCents' | 'refundsCents' | 'netCents' | 'tips'> {
  /** what cash and card orders took, before refunds (together grossCents) */
  cashCents: number;
  cardCents: number;
  /** null when no ticket was timed */
  medianWaitSeconds: number | null;
  p90WaitSeconds: number | null;
  /** timed tickets that waited longer than the target */
  overTargetCount: number;
  timedTickets: number;
  shotsPulled: number;
}

export interface DayRow extends DayFigures {
  /** café-local date, YYYY-MM-DD */
  date: string;
}

export interface ReportDaysView {
  /** café-local dates, both included */
  from: string;
  to: string;
  currency: string;
  locale: string;
  timeZone: string;
  targetSeconds: number;
  /** every date of the range, oldest first, a date without orders as zeros */
  days: DayRow[];
  /** the whole range's report: its waits are the range's own, not sums of the days' */
  total: DayFigures;
}

/** Dates from `from` to `to`, both counted (2026-03-01 → 2026-03-03: 3); 0 when reversed. */
export function daysInRange(from: string, to: string): number {
  return Math.max(0, Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000) + 1);
}

type ReportFigures = Pick<
  ReportView,
  'orders' | 'drinks' | 'grossCents' | 'taxCents' | 'discountCents' | 'refundsCents' | 'netCents' | 'tips' | 'paymentMix' | 'waits' | 'shotsPulled'
>;

/** A report's figures as a day's row shows them. */
export function dayFigures(report: ReportFigures): DayFigures {
  const w = report.waits;
  return {
    orders: report.orders,
    drinks: report.drinks,
    grossCents: report.grossCents,
    taxCents: report.taxCents,
    discountCents: report.discountCents,
    refundsCents: report.refundsCents,
    netCents: report.netCents,
    tips: report.tips,
    cashCents: report.paymentMix.cash.cents,
    cardCents: report.paymentMix.card.cents,
    medianWaitSeconds: w.medianSeconds,
    p90WaitSeconds: w.p90Seconds,
    // the summary keeps the share (over ÷ count); rounding undoes the division's float error
    overTargetCount: w.overTargetShare === null ? 0 : Math.round(w.overTargetShare * w.count),
    timedTickets: w.count,
    shotsPulled: report.shotsPulled,
  };
}
