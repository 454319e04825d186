// The report's headline numbers as tiles, the waits said in café words, and (in a help note)
// which percentile definition they use.
import type { ReactNode } from 'react';
import { formatCents } from '@/domain/money';
import { formatDuration } from '@/domain/format';
import { formatCount, formatShare, type ReportView } from '@/domain/reports';
import { PERCENTILE_METHOD } from '@/domain/stats';

export function Tile({ label, value, hint, testId }: { label: string; value: ReactNode; hint?: ReactNode; testId?: string }) {
  return (
    <div className="rounded-xl border border-steam-200 bg-white px-4 py-3" data-testid={testId}>
      <dt className="text-sm font-semibold tracking-widest text-ink-600 uppercase">{label}</dt>
      <dd className="font-display text-3xl font-semibold whitespace-nowrap tabular-nums 2xl:text-4xl">{value}</dd>
      {hint && <dd className="text-sm text-ink-600">{hint}</dd>}
    </div>
  );
}

export function ReportTiles({ report }: { report: ReportView }) {
  const money = (cents: number) => formatCents(cents, report.currency, report.locale);
  const { waits } = report;
  const target = formatDuration(report.targetSeconds);
  const group = 'grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-6';
  const heading = 'mb-1 text-sm font-semibold tracking-widest text-ink-600 uppercase';
  return (
    <>
      <section aria-labelledby="sales-heading">
        <h2 id="sales-heading" className={heading}>
          Sales
        </h2>
        <dl className={group}>
          <Tile label="Orders" value={formatCount(report.orders, report.locale)} hint="paid" testId="tile-orders" />
          <Tile label="Drinks" value={formatCount(report.drinks, report.locale)} hint="from the bar" testId="tile-drinks" />
          <Tile label="Net revenue" value={money(report.netCents)} hint={`gross ${money(report.grossCents)} less refunds`} testId="tile-net" />
          <Tile label="Tax" value={money(report.taxCents)} hint="charged" />
          <Tile label="Discounts" value={money(report.discountCents)} hint="given" />
          <Tile label="Refunds" value={money(report.refundsCents)} hint="given back" />
          {report.tips.cents > 0 && (
            // the customers' money for the staff: apart from the café's revenue and never taxed
            <Tile
              label="Tips"
              value={money(report.tips.cents)}
              hint={`cash ${money(report.tips.cashCents)} · card ${money(report.tips.cardCents)}; not in net or tax`}
              testId="tile-tips"
            />
          )}
        </dl>
      </section>
      <section aria-labelledby="waits-heading">
        <h2 id="waits-heading" className={heading}>
          Ticket waits
        </h2>
        <div className={group}>
          <dl className="col-span-2 grid grid-cols-2 gap-3 sm:col-span-3 sm:grid-cols-3">
            <Tile
              label="Half waited under"
              value={formatDuration(waits.medianSeconds)}
              hint={`of ${formatCount(waits.count, report.locale)} ${waits.count === 1 ? 'ticket' : 'tickets'} timed`}
              testId="tile-median"
            />
            <Tile label="9 in 10 waited under" value={formatDuration(waits.p90Seconds)} hint="the slow end of the rush" testId="tile-p90" />
            <Tile label="Over target" value={formatShare(waits.overTargetShare, report.locale)} hint={`waited longer than ${target}`} />
          </dl>
          <div className="col-span-2 self-center text-base text-ink-600 sm:col-span-3">
            <p className="text-lg text-ink-900" data-testid="waits-words">
              {waits.count === 0
                ? 'No ticket was timed in this period.'
                : `Half of the tickets waited under ${formatDuration(waits.medianSeconds)}; 9 in 10 under ${formatDuration(waits.p90Seconds)}.`}{' '}
              A wait runs from the ticket reaching the bar to ready, in minutes:seconds.
            </p>
            <details className="mt-1">
              <summary className="cursor-pointer underline underline-offset-4">How the waits are worked out</summary>
              <p data-testid="percentile-method">
                &ldquo;Half waited under&rdquo; is the median and &ldquo;9 in 10&rdquo; the 90th percentile, by {PERCENTILE_METHOD}.
              </p>
            </details>
          </div>
        </div>
      </section>
    </>
  );
}
