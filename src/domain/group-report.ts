// The café group's report: each café's range report cut down to one row, side by side, and the
// group's totals. The figures are the cafés' own reports (server/reports/group.ts asks each for its
// range report); nothing here counts an order again, it only picks and sums.
import { sumTips, type ReportView, type TipTotals } from './reports';
import type { WaitSummary } from './stats';

/** One café's row: what its own range report says for the same dates. */
export interface GroupCafeRow {
  id: number;
  name: string;
  currency: string;
  locale: string;
  orders: number;
  drinks: number;
  grossCents: number;
  refundsCents: number;
  netCents: number;
  /** the customers' tips, kept, as the café's report shows them: never in net */
  tips: TipTotals;
  /** the café's waits against its own target; percentiles can't be summed, so no group figure */
  waits: WaitSummary;
  targetSeconds: number;
}

/** Sums across the group, in the one currency all its cafés share. */
export interface GroupTotals {
  currency: string;
  orders: number;
  drinks: number;
  grossCents: number;
  refundsCents: number;
  netCents: number;
  tips: TipTotals;
}

export interface GroupReportView {
  /** café-local dates, both included: each café's own calendar */
  from: string;
  to: string;
  /** oldest café first */
  cafes: GroupCafeRow[];
  /** null when the cafés don't all take one currency: dollars and euros don't add up */
  totals: GroupTotals | null;
}

export function groupCafeRow(cafe: { id: number; name: string }, report: ReportView): GroupCafeRow {
  return {
    id: cafe.id,
    name: cafe.name,
    currency: report.currency,
    locale: report.locale,
    orders: report.orders,
    drinks: report.drinks,
    grossCents: report.grossCents,
    refundsCents: report.refundsCents,
    netCents: report.netCents,
    tips: report.tips,
    waits: report.waits,
    targetSeconds: report.targetSeconds,
  };
}

export function groupTotals(rows: GroupCafeRow[]): GroupTotals | null {
  if (rows.length === 0 || rows.some((r) => r.currency !== rows[0].currency)) return null;
  const sum = (pick: (r: GroupCafeRow) => number) => rows.reduce((total, r) => total + pick(r), 0);
  return {
    currency: rows[0].currency,
    orders: sum((r) => r.orders),
    drinks: sum((r) => r.drinks),
    grossCents: sum((r) => r.grossCents),
    refundsCents: sum((r) => r.refundsCents),
    netCents: sum((r) => r.netCents),
    tips: sumTips(rows.map((r) => r.tips)),
  };
}

/** The group's report from each café's range report over the same dates, in the cafés' order. */
export function groupReportView(from: string, to: string, reports: { cafe: { id: number; name: string }; report: ReportView }[]): GroupReportView {
  const cafes = reports.map(({ cafe, report }) => groupCafeRow(cafe, report));
  return { from, to, cafes, totals: groupTotals(cafes) };
}
