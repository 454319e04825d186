// The owner's cafés side by side over the chosen dates: each café's own figures in its own
// currency, and the group's totals when they add up (one currency). Waits stay per café: a median
// of medians is no one's median.
import { ScrollBox } from '@/components/ui/scroll-box';
import { Panel, numClass, tdClass } from '@/components/report/report-breakdowns';
import { FiguresHead, TipsCell } from './figures-head';
import { formatDuration } from '@/domain/format';
import type { GroupReportView } from '@/domain/group-report';
import { formatCents } from '@/domain/money';
import { plural } from '@/domain/plural';
import { formatCount, formatShare } from '@/domain/reports';
import { cn } from '@/lib/cn';

export function GroupTable({ group, inView }: { group: GroupReportView; inView: string | null }) {
  const { cafes, totals } = group;
  const locale = cafes[0]?.locale ?? 'en-US';
  // the column only when a café had tips, as a café's report shows its Tips tile only then
  const tips = cafes.some((c) => c.tips.cents > 0);
  return (
    <Panel title="Cafés side by side">
      {/* outside the scroll box, so on a phone it wraps to the screen rather than scrolling with the table */}
      <p id="group-report-note" className="mb-1 text-sm text-ink-600">
        Each café over the same dates, in its own currency; waits against each café’s own target.
        {inView && ` The rest of this page is ${inView} alone.`}
      </p>
      <ScrollBox label="Cafés side by side table">
        <table className="w-full text-base" data-testid="group-report" aria-describedby="group-report-note">
          <FiguresHead rowLabel="Café" tips={tips} />
          <tbody>
            {cafes.map((c) => (
              <tr key={c.id} data-testid="group-cafe">
                <th scope="row" className={cn(tdClass, 'text-left font-semibold')}>
                  {c.name}
                </th>
                <td className={cn(tdClass, numClass)} data-testid="group-orders">
                  {formatCount(c.orders, c.locale)}
                </td>
                <td className={cn(tdClass, numClass)}>{formatCount(c.drinks, c.locale)}</td>
                <td className={cn(tdClass, numClass)}>{formatCents(c.netCents, c.currency, c.locale)}</td>
                {tips && <TipsCell tips={c.tips} money={(x) => formatCents(x, c.currency, c.locale)} className={cn(tdClass, numClass)} />}
                <td className={cn(tdClass, numClass)}>
                  {formatDuration(c.waits.medianSeconds)}
                  <span className="block text-sm text-ink-600">{plural(c.waits.count, 'ticket')} timed</span>
                </td>
                <td className={cn(tdClass, numClass)}>
                  {formatShare(c.waits.overTargetShare, c.locale)}
                  <span className="block text-sm text-ink-600">over {formatDuration(c.targetSeconds)}</span>
                </td>
              </tr>
            ))}
          </tbody>
          {totals && (
            <tfoot>
              <tr data-testid="group-totals" className="font-semibold">
                <th scope="row" className="border-t-2 border-steam-200 px-2 py-1.5 text-left">
                  All {formatCount(cafes.length, locale)} cafés
                </th>
                <td className={cn('border-t-2 border-steam-200 px-2 py-1.5', numClass)}>{formatCount(totals.orders, locale)}</td>
                <td className={cn('border-t-2 border-steam-200 px-2 py-1.5', numClass)}>{formatCount(totals.drinks, locale)}</td>
                <td className={cn('border-t-2 border-steam-200 px-2 py-1.5', numClass)}>{formatCents(totals.netCents, totals.currency, locale)}</td>
                {tips && (
                  <TipsCell
                    tips={totals.tips}
                    money={(x) => formatCents(x, totals.currency, locale)}
                    className={cn('border-t-2 border-steam-200 px-2 py-1.5', numClass)}
                  />
                )}
                <td colSpan={2} className="border-t-2 border-steam-200 px-2 py-1.5 text-right text-sm font-normal text-ink-600">
                  waits are each café’s own
                </td>
              </tr>
            </tfoot>
          )}
        </table>
      </ScrollBox>
      {!totals && <p className="mt-2 text-base text-ink-600">No group total: the cafés take different currencies.</p>}
    </Panel>
  );
}
