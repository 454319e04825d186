// CSV exports of the ticket history and of a report, through toCsv (every text cell neutralised
// against formula injection, OWASP "CSV Injection"). Money as decimal amounts in the café's
// currency (12.5 for $12.50) so a spreadsheet can add them up. The ticket list's times are the
// café's wall clock with its offset and its words are the screen's; the report's stay ISO-8601 UTC.
import { toCsv } from '@/domain/csv';
import { hourLabel, type ReportView, type TicketHistoryRow } from '@/domain/reports';
import type { DayFigures, ReportDaysView } from '@/domain/report-days';
import { PERCENTILE_METHOD } from '@/domain/stats';
import { REMAKE_REASON_SHORT } from '@/domain/remakes';
import { localIsoWithOffset, PAYMENT_METHOD_WORDS, PAYMENT_STATUS_WORDS, TICKET_STATUS_WORDS } from '@/domain/ticket-words';

/** 790 → "7.90": two decimals, as a spreadsheet reads an amount */
const amount = (cents: number) => (cents / 100).toFixed(2);

export function ticketsCsv(rows: TicketHistoryRow[], currency: string, timeZone: string): string {
  const columns = [
    { key: 'businessDate', header: 'Date' },
    { key: 'number', header: 'Ticket' },
    { key: 'customerName', header: 'Customer' },
    { key: 'status', header: 'Status' },
    { key: 'paymentStatus', header: 'Payment' },
    { key: 'paymentMethod', header: 'Method' },
    { key: 'total', header: `Total (${currency})` },
    { key: 'refunded', header: `Refunded (${currency})` },
    { key: 'drinks', header: 'Drinks' },
    { key: 'createdAt', header: `Taken at (${timeZone})` },
    { key: 'readyAt', header: `Ready at (${timeZone})` },
    { key: 'waitSeconds', header: 'Wait (s)' },
  ];
  return toCsv(
    columns,
    rows.map((r) => ({
      ...r,
      status: TICKET_STATUS_WORDS[r.status],
      paymentStatus: PAYMENT_STATUS_WORDS[r.paymentStatus],
      paymentMethod: PAYMENT_METHOD_WORDS[r.paymentMethod],
      total: amount(r.totalCents),
      refunded: amount(r.refundedCents),
      createdAt: localIsoWithOffset(r.createdAt, timeZone),
      readyAt: r.readyAt && localIsoWithOffset(r.readyAt, timeZone),
    })),
  );
}

/** A report as long-format rows: section, item, metric, value (one fact per row). */
export function reportCsv(report: ReportView): string {
  const cur = report.currency;
  const rows: { section: string; item?: string; metric: string; value: number | string | null }[] = [];
  const add = (section: string, item: string | undefined, metric: string, value: number | string | null) => rows.push({ section, item, metric, value });
  const p = report.period;
  add('Period', undefined, 'kind', p.kind);
  add('Period', undefined, 'from', p.from);
  add('Period', undefined, 'to', p.to);
  if (p.shift) {
    add('Period', undefined, 'shift', p.shift.id);
    add('Period', undefined, 'opened at (UTC)', p.shift.openedAt);
    add('Period', undefined, 'closed at (UTC)', p.shift.closedAt);
    const c = p.shift.cash;
    const cents = (x: number | null) => (x === null ? null : amount(x));
    add('Cash drawer', undefined, `float (${cur})`, amount(c.openingFloatCents));
    add('Cash drawer', undefined, `expected (${cur})`, amount(c.expectedCashCents));
    add('Cash drawer', undefined, `counted (${cur})`, cents(c.countedCashCents));
    // a number, not text: a short drawer's "-1.25" must stay a sum a spreadsheet can add
    add('Cash drawer', undefined, `difference (${cur})`, c.differenceCents === null ? null : c.differenceCents / 100);
    add('Cash drawer', undefined, 'note', c.closeNote);
    add('Cash drawer', undefined, 'opened by', c.openedBy);
    add('Cash drawer', undefined, 'closed by', c.closedBy);
    add('Cash drawer', undefined, 'tickets still open at close', c.openTicketsAtClose);
    add('Cash drawer', undefined, 'oldest open ticket wait (s)', c.oldestOpenWaitSecondsAtClose);
  }
  add('Totals', undefined, 'orders', report.orders);
  add('Totals', undefined, 'drinks', report.drinks);
  add('Totals', undefined, `gross (${cur})`, amount(report.grossCents));
  add('Totals', undefined, `tax (${cur})`, amount(report.taxCents));
  add('Totals', undefined, `discounts (${cur})`, amount(report.discountCents));
  add('Totals', undefined, `refunds (${cur})`, amount(report.refundsCents));
  add('Totals', undefined, `net (${cur})`, amount(report.netCents));
  // tips are the staff's, outside gross, net and tax
  add('Tips', undefined, `total (${cur})`, amount(report.tips.cents));
  add('Tips', 'cash', `kept (${cur})`, amount(report.tips.cashCents));
  add('Tips', 'card', `kept (${cur})`, amount(report.tips.cardCents));
  // remakes are waste: the drinks they replaced went in the bin (per reason, in the list's order)
  add('Remakes', undefined, 'drinks remade', report.remakes.count);
  for (const r of report.remakes.byReason) {
    add('Remakes', REMAKE_REASON_SHORT[r.reason], 'drinks remade', r.count);
    add('Remakes', REMAKE_REASON_SHORT[r.reason], 'coffee wasted (g)', r.doseDg / 10);
    add('Remakes', REMAKE_REASON_SHORT[r.reason], 'milk wasted (ml)', r.milkMl);
  }
  for (const m of ['cash', 'card'] as const) {
    add('Payment mix', m, 'orders', report.paymentMix[m].orders);
    add('Payment mix', m, `taken (${cur})`, amount(report.paymentMix[m].cents));
  }
  const w = report.waits;
  add('Waits', undefined, 'tickets timed', w.count);
  add('Waits', undefined, 'target (s)', report.targetSeconds);
  // seconds to one decimal: a spreadsheet has no use for 102.48490000000001
  const s1 = (x: number | null) => (x === null ? null : Math.round(x * 10) / 10);
  add('Waits', undefined, 'mean (s)', s1(w.meanSeconds));
  add('Waits', undefined, 'median (s)', s1(w.medianSeconds));
  add('Waits', undefined, 'p90 (s)', s1(w.p90Seconds));
  add('Waits', undefined, 'max (s)', s1(w.maxSeconds));
  add('Waits', undefined, 'over target share', w.overTargetShare);
  add('Waits', undefined, 'percentile method', PERCENTILE_METHOD);
  add('Bar', undefined, 'shots pulled', report.shotsPulled);
  add('Bar', undefined, 'coffee used (g)', report.coffeeUsedDg / 10);
  for (const m of report.milkUsedMl) add('Milk used', m.milk, 'ml', m.ml);
  for (const i of report.topItems) {
    add('Top items', i.item, 'count', i.count);
    add('Top items', i.item, `sales (${cur})`, amount(i.cents));
  }
  for (const h of report.hourly) {
    const label = hourLabel(h.hour);
    add('Hourly', label, 'orders', h.orders);
    add('Hourly', label, 'drinks', h.drinks);
    add('Hourly', label, `sales (${cur})`, amount(h.cents));
    add('Hourly', label, 'median wait (s)', h.medianWaitSeconds === null ? null : Math.round(h.medianWaitSeconds * 10) / 10);
  }
  for (const t of report.overTarget) add('Over target', `${t.businessDate} #${t.number} ${t.customerName}`, 'wait (s)', t.waitSeconds);
  return toCsv(
    [
      { key: 'section', header: 'Section' },
      { key: 'item', header: 'Item' },
      { key: 'metric', header: 'Metric' },
      { key: 'value', header: 'Value' },
    ],
    rows,
  );
}

/** Day by day as a table: a header row, a row per date (oldest first), then the range's total. */
export function reportDaysCsv(view: ReportDaysView): string {
  const cur = view.currency;
  const columns = [
    { key: 'date', header: 'Date' },
    { key: 'orders', header: 'Orders' },
    { key: 'drinks', header: 'Drinks' },
    { key: 'gross', header: `Gross (${cur})` },
    { key: 'tax', header: `Tax (${cur})` },
    { key: 'discount', header: `Discounts (${cur})` },
    { key: 'refunds', header: `Refunds (${cur})` },
    { key: 'net', header: `Net (${cur})` },
    { key: 'cash', header: `Cash (${cur})` },
    { key: 'card', header: `Card (${cur})` },
    // the staff's, outside gross, net and tax, as in the report's CSV
    { key: 'tips', header: `Tips (${cur})` },
    { key: 'cashTips', header: `Cash tips (${cur})` },
    { key: 'cardTips', header: `Card tips (${cur})` },
    { key: 'median', header: 'Median wait (s)' },
    { key: 'p90', header: 'p90 wait (s)' },
    { key: 'overTarget', header: `Over ${view.targetSeconds} s target` },
    { key: 'timed', header: 'Tickets timed' },
    { key: 'shots', header: 'Shots pulled' },
  ];
  // seconds to one decimal, as the report's CSV writes them
  const s1 = (x: number | null) => (x === null ? null : Math.round(x * 10) / 10);
  const row = (date: string, f: DayFigures) => ({
    date,
    orders: f.orders,
    drinks: f.drinks,
    gross: amount(f.grossCents),
    tax: amount(f.taxCents),
    discount: amount(f.discountCents),
    refunds: amount(f.refundsCents),
    net: amount(f.netCents),
    cash: amount(f.cashCents),
    card: amount(f.cardCents),
    tips: amount(f.tips.cents),
    cashTips: amount(f.tips.cashCents),
    cardTips: amount(f.tips.cardCents),
    median: s1(f.medianWaitSeconds),
    p90: s1(f.p90WaitSeconds),
    overTarget: f.overTargetCount,
    timed: f.timedTickets,
    shots: f.shotsPulled,
  });
  return toCsv(columns, [...view.days.map((d) => row(d.date, d)), row('Total', view.total)]);
}
