// The shift report as an e-mail for the owner: plain text and HTML, from a ReportView. Pure: the
// caller sends it (e.g. with the Mailer when a shift closes).
import { REMAKE_REASON_SHORT } from '@/domain/remakes';
import { formatCents } from '@/domain/money';
import { formatDuration } from '@/domain/format';
import { formatCoffee, formatLitres, formatShare, type ReportView } from '@/domain/reports';
import { cashDifferenceWords, openTicketsWords } from '@/domain/shift-close';
import { PERCENTILE_METHOD } from '@/domain/stats';
import { escapeHtml } from '@/domain/html';

export interface ReportMailLocation {
  name: string;
  /** defaults to the report's own */
  currency?: string;
  locale?: string;
  timeZone?: string;
}

export interface ReportEmail {
  subject: string;
  text: string;
  html: string;
}

type Row = [label: string, value: string];

export function shiftReportEmail(report: ReportView, location: ReportMailLocation): ReportEmail {
  const locale = location.locale ?? report.locale;
  const timeZone = location.timeZone ?? report.timeZone;
  const money = (cents: number) => formatCents(cents, location.currency ?? report.currency, locale);
  const at = (iso: string) => new Intl.DateTimeFormat(locale, { dateStyle: 'medium', timeStyle: 'short', timeZone }).format(new Date(iso));
  const { period, waits } = report;
  const shift = period.shift;
  const title = shift ? `Shift report — ${location.name}` : `Report — ${location.name}`;
  const when = shift
    ? `${at(shift.openedAt)} – ${shift.closedAt ? at(shift.closedAt) : 'still open'}`
    : period.from === period.to
      ? period.from
      : `${period.from} to ${period.to}`;
  const subject = shift
    ? `${location.name}: shift ${period.from}${period.to !== period.from ? ` – ${period.to}` : ''}, net ${money(report.netCents)}`
    : `${location.name}: report ${when}, net ${money(report.netCents)}`;

  const sales: Row[] = [
    ['Orders', String(report.orders)],
    ['Drinks', String(report.drinks)],
    ['Gross', money(report.grossCents)],
    ['Discounts', money(report.discountCents)],
    ['Tax', money(report.taxCents)],
    ['Refunds', money(report.refundsCents)],
    ['Net (gross less refunds)', money(report.netCents)],
    ...(report.tips.cents > 0
      ? [['Tips (not in net or tax)', `${money(report.tips.cents)} · cash ${money(report.tips.cashCents)} · card ${money(report.tips.cardCents)}`] as Row]
      : []),
    ['Cash', `${report.paymentMix.cash.orders} orders · ${money(report.paymentMix.cash.cents)}`],
    ['Card', `${report.paymentMix.card.orders} orders · ${money(report.paymentMix.card.cents)}`],
  ];
  const bar: Row[] = [
    ['Tickets timed', String(waits.count)],
    ['Median wait', formatDuration(waits.medianSeconds)],
    ['90th percentile wait', formatDuration(waits.p90Seconds)],
    ['Longest wait', formatDuration(waits.maxSeconds)],
    [`Over the ${formatDuration(report.targetSeconds)} target`, formatShare(waits.overTargetShare, locale)],
    ['Shots pulled', String(report.shotsPulled)],
    ['Coffee used', formatCoffee(report.coffeeUsedDg, locale)],
    ...report.milkUsedMl.map((m): Row => [`Milk: ${m.milk}`, formatLitres(m.ml, locale)]),
    // remakes as waste, per reason, only when there were any
    ...report.remakes.byReason.map((r): Row => [
      `Remade: ${REMAKE_REASON_SHORT[r.reason]}`,
      `${r.count} · ${formatCoffee(r.doseDg, locale)} coffee · ${formatLitres(r.milkMl, locale)} milk wasted`,
    ]),
  ];
  const cash = shift?.cash;
  const currency = location.currency ?? report.currency;
  const drawer: Row[] = cash
    ? [
        ['Opened by', cash.openedBy ?? '—'],
        ['Float', money(cash.openingFloatCents)],
        ['Expected in the drawer', money(cash.expectedCashCents)],
        ['Counted', cash.countedCashCents === null ? 'not counted yet' : money(cash.countedCashCents)],
        ['Difference', cash.countedCashCents === null ? '—' : cashDifferenceWords(cash.expectedCashCents, cash.countedCashCents, currency, locale)],
        ['Note', cash.closeNote ?? '—'],
        ['Closed by', cash.closedBy ?? 'still open'],
        [
          'Tickets still open at close',
          cash.openTicketsAtClose === null
            ? '—'
            : openTicketsWords({ openTickets: cash.openTicketsAtClose, oldestWaitSeconds: cash.oldestOpenWaitSecondsAtClose }),
        ],
      ]
    : [];
  const items: Row[] = report.topItems.map((i) => [`${i.item} × ${i.count}`, money(i.cents)]);
  const note = `Percentiles: ${PERCENTILE_METHOD}. Wait = fired to ready.`;
  const sections: [string, Row[]][] = [
    ...(drawer.length ? [['Cash drawer', drawer] as [string, Row[]]] : []),
    ['Sales', sales],
    ['Bar', bar],
    ...(items.length ? [['Top items', items] as [string, Row[]]] : []),
  ];

  const text = [title, when, '', ...sections.flatMap(([heading, rows]) => [heading, ...rows.map(([l, v]) => `  ${l}: ${v}`), '']), note, ''].join('\n');

  const e = escapeHtml;
  const cell = 'padding:4px 0;border-bottom:1px solid #e4ddd2';
  const table = (rows: Row[]) =>
    `<table style="width:100%;border-collapse:collapse">` +
    rows.map(([l, v]) => `<tr><td style="${cell}">${e(l)}</td><td style="${cell};text-align:right;white-space:nowrap">${e(v)}</td></tr>`).join('') +
    `</table>`;
  const html =
    `<!doctype html><html lang="${e(locale)}"><body style="margin:0;background:#fbfaf7;color:#1d1a17;font-family:Helvetica,Arial,sans-serif">` +
    `<div style="max-width:520px;margin:0 auto;padding:24px">` +
    `<h1 style="margin:0;font-size:22px">${e(title)}</h1>` +
    `<p style="margin:4px 0 16px;color:#5a5047">${e(when)}</p>` +
    sections.map(([heading, rows]) => `<h2 style="margin:20px 0 6px;font-size:17px">${e(heading)}</h2>${table(rows)}`).join('') +
    `<p style="margin:20px 0 0;color:#5a5047;font-size:13px">${e(note)}</p>` +
    `</div></body></html>`;

  return { subject, text, html };
}
