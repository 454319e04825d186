// The report in parts: how people paid, what the bar used, what sold best, and what remakes wasted.
import { ScrollBox } from '@/components/ui/scroll-box';
import type { ReactNode } from 'react';
import { formatCents } from '@/domain/money';
import { formatCoffee, formatCount, formatLitres, formatShare, type ReportView } from '@/domain/reports';
import { REMAKE_REASON_SHORT } from '@/domain/remakes';
import { cn } from '@/lib/cn';

export const cardClass = 'min-w-0 rounded-xl border border-steam-200 bg-white p-4';
export const thClass = 'border-b-2 border-steam-200 px-2 py-1 text-left text-sm font-semibold tracking-wide text-ink-600 uppercase';
export const tdClass = 'border-b border-steam-100 px-2 py-1.5';
export const numClass = 'text-right tabular-nums';

export function Panel({ title, children, className }: { title: string; children: ReactNode; className?: string }) {
  const id = `panel-${title.toLowerCase().replace(/[^a-z]+/g, '-')}`;
  return (
    <section aria-labelledby={id} className={cn(cardClass, className)}>
      <h2 id={id} className="mb-2 text-xl font-semibold">
        {title}
      </h2>
      {children}
    </section>
  );
}

/** A share shown as a bar and its number, so the length is never the only cue. */
export function ShareBar({ share, label }: { share: number; label: string }) {
  return (
    <div className="flex items-center gap-2">
      <div aria-hidden className="h-3 flex-1 rounded-full bg-steam-100">
        <div className="h-3 rounded-full bg-copper-700" style={{ width: `${Math.round(Math.min(1, Math.max(0, share)) * 100)}%` }} />
      </div>
      <span className="min-w-14 text-right text-sm whitespace-nowrap tabular-nums">{label}</span>
    </div>
  );
}

export function PaymentMix({ report }: { report: ReportView }) {
  const money = (c: number) => formatCents(c, report.currency, report.locale);
  const rows = [
    ['Cash', report.paymentMix.cash],
    ['Card', report.paymentMix.card],
  ] as const;
  return (
    <Panel title="Payment mix">
      <ScrollBox label="Payment mix table">
        <table className="w-full text-base">
          <thead>
            <tr>
              <th className={thClass}>Method</th>
              <th className={cn(thClass, 'text-right')}>Orders</th>
              <th className={cn(thClass, 'text-right')}>Taken</th>
            </tr>
          </thead>
          <tbody>
            {rows.map(([label, m]) => (
              <tr key={label}>
                <td className={tdClass}>
                  {label}
                  <ShareBar
                    share={report.grossCents ? m.cents / report.grossCents : 0}
                    label={report.grossCents ? formatShare(m.cents / report.grossCents, report.locale) : '—'}
                  />
                </td>
                <td className={cn(tdClass, numClass)}>{formatCount(m.orders, report.locale)}</td>
                <td className={cn(tdClass, numClass)}>{money(m.cents)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </ScrollBox>
      <p className="mt-2 text-sm text-ink-600">Taken before refunds; the two add up to the gross {money(report.grossCents)}.</p>
    </Panel>
  );
}

export function BarUse({ report }: { report: ReportView }) {
  const totalMl = report.milkUsedMl.reduce((a, m) => a + m.ml, 0);
  return (
    <Panel title="Bar use">
      <dl className="grid grid-cols-2 gap-3">
        <div>
          <dt className="text-sm font-semibold tracking-widest text-ink-600 uppercase">Shots pulled</dt>
          <dd className="font-display text-3xl font-semibold tabular-nums" data-testid="shots-pulled">
            {formatCount(report.shotsPulled, report.locale)}
          </dd>
        </div>
        <div>
          <dt className="text-sm font-semibold tracking-widest text-ink-600 uppercase">Coffee used</dt>
          <dd className="font-display text-3xl font-semibold tabular-nums">{formatCoffee(report.coffeeUsedDg, report.locale)}</dd>
        </div>
      </dl>
      <h3 className="mt-3 text-base font-semibold">Milk used</h3>
      {report.milkUsedMl.length === 0 ? (
        <p className="text-base text-ink-600">No milk drinks made.</p>
      ) : (
        <ScrollBox label="Milk used table">
          <table className="w-full text-base" data-testid="milk-used">
            <tbody>
              {report.milkUsedMl.map((m) => (
                <tr key={m.milk}>
                  <td className={cn(tdClass, 'w-24')}>{m.milk}</td>
                  <td className={tdClass}>
                    <ShareBar share={totalMl ? m.ml / totalMl : 0} label={formatLitres(m.ml, report.locale)} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollBox>
      )}
      <p className="mt-2 text-sm text-ink-600">Cold milk the recipes take, for the drinks bumped done; pitcher waste not included.</p>
    </Panel>
  );
}

export function TopItems({ report }: { report: ReportView }) {
  const money = (c: number) => formatCents(c, report.currency, report.locale);
  return (
    <Panel title="Top items">
      {report.topItems.length === 0 ? (
        <p className="text-base text-ink-600">Nothing sold in this period.</p>
      ) : (
        <ScrollBox label="Top items table">
          <table className="w-full text-base">
            <thead>
              <tr>
                <th className={thClass}>Item</th>
                <th className={cn(thClass, 'text-right')}>Sold</th>
                <th className={cn(thClass, 'text-right')}>Sales</th>
              </tr>
            </thead>
            <tbody>
              {report.topItems.map((i) => (
                <tr key={i.item}>
                  <td className={tdClass}>{i.item}</td>
                  <td className={cn(tdClass, numClass)}>{formatCount(i.count, report.locale)}</td>
                  <td className={cn(tdClass, numClass)}>{money(i.cents)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollBox>
      )}
      <p className="mt-2 text-sm text-ink-600">Menu prices, before order discounts.</p>
    </Panel>
  );
}

/** Drinks made again at no charge, per reason: the waste the bar can work on. */
export function RemakeWastePanel({ report }: { report: ReportView }) {
  const w = report.remakes;
  return (
    <Panel title="Remakes">
      {w.count === 0 ? (
        <p className="text-base text-ink-600">No drinks remade.</p>
      ) : (
        <ScrollBox label="Remakes table">
          <table className="w-full text-base" data-testid="remake-waste">
            <thead>
              <tr>
                <th className={thClass}>Reason</th>
                <th className={cn(thClass, numClass)}>Drinks</th>
                <th className={cn(thClass, numClass)}>Coffee</th>
                <th className={cn(thClass, numClass)}>Milk</th>
              </tr>
            </thead>
            <tbody>
              {w.byReason.map((r) => (
                <tr key={r.reason}>
                  <td className={tdClass}>{REMAKE_REASON_SHORT[r.reason]}</td>
                  <td className={cn(tdClass, numClass)}>{formatCount(r.count, report.locale)}</td>
                  <td className={cn(tdClass, numClass)}>{formatCoffee(r.doseDg, report.locale)}</td>
                  <td className={cn(tdClass, numClass)}>{formatLitres(r.milkMl, report.locale)}</td>
                </tr>
              ))}
              <tr className="font-semibold">
                <td className={tdClass}>All</td>
                <td className={cn(tdClass, numClass)}>{formatCount(w.count, report.locale)}</td>
                <td className={cn(tdClass, numClass)}>{formatCoffee(w.doseDg, report.locale)}</td>
                <td className={cn(tdClass, numClass)}>{formatLitres(w.milkMl, report.locale)}</td>
              </tr>
            </tbody>
          </table>
        </ScrollBox>
      )}
      <p className="mt-2 text-sm text-ink-600">Wasted: the coffee and cold milk of the drinks the remakes replaced.</p>
    </Panel>
  );
}
