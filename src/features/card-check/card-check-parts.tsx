// The card check's parts: the verdict, the two sides' totals, and the charge and refund lines,
// each with how it stands and why. A mismatch is told by its word and mark, not by colour alone.
import type { ReactNode } from 'react';
import {
  CHECK_NOTES,
  type AttemptStatus,
  type CardCheckCharge,
  type CardCheckRefund,
  type CardCheckView,
  type CheckNote,
  type Match,
  type ProviderChargeStatus,
} from '@/domain/card-check';
import { formatCents } from '@/domain/money';
import { cn } from '@/lib/cn';
import { Panel, numClass, tdClass, thClass } from '@/components/report/report-breakdowns';
import { Tile } from '@/components/report/report-tiles';
import { ScrollBox } from '@/components/ui/scroll-box';

const PROVIDER_WORD: Record<ProviderChargeStatus | 'missing', string> = {
  succeeded: 'Taken',
  declined: 'Declined',
  open: 'Not run',
  canceled: 'Canceled',
  pending: 'Processing',
  missing: 'None this day',
};
const JUGLINE_WORD: Record<AttemptStatus, string> = {
  succeeded: 'Recorded',
  declined: 'Declined',
  failed: 'Not charged',
  canceled: 'Canceled',
  unknown: 'Answer lost',
  processing: 'In progress',
  refunding: 'Giving back',
  refunded: 'Given back',
};
const MATCH_WORD: Record<Match, { mark: string; word: string }> = {
  recorded: { mark: '✓', word: 'In step' },
  matched: { mark: '✓', word: 'In step' },
  given_back: { mark: '✓', word: 'Given back' },
  no_money: { mark: '–', word: 'No money' },
  mismatch: { mark: '!', word: 'Mismatch' },
  unchecked: { mark: '?', word: 'Not checked' },
};

type Money = (cents: number) => string;

/** Lines that settling can close: mismatches, and attempts whose answer was never heard. */
export function openLines(view: CardCheckView): number {
  return [...view.charges, ...view.refunds].filter((l) => l.match === 'mismatch' || l.note === 'unresolved').length;
}

export function Verdict({ view, money }: { view: CardCheckView; money: Money }) {
  const inStep = view.provider !== null && view.mismatches === 0 && view.differenceCents === 0;
  const text =
    view.provider === null
      ? 'Not checked: only Jugline’s side is shown.'
      : inStep
        ? 'In step: the card service and Jugline agree on every charge and refund.'
        : `${view.mismatches} ${view.mismatches === 1 ? 'line needs' : 'lines need'} a look; the card service’s net is ${money(view.differenceCents ?? 0)} ${(view.differenceCents ?? 0) < 0 ? 'under' : 'over'} Jugline’s.`;
  return (
    <p
      role="status"
      data-testid="card-check-verdict"
      className={cn(
        'flex items-center gap-3 rounded-xl border-l-8 px-4 py-3 text-xl font-semibold',
        inStep ? 'border-copper-700 bg-white' : 'border-alert-deep bg-alert-ink/30',
      )}
    >
      <span aria-hidden className="font-display text-3xl">
        {inStep ? '✓' : '!'}
      </span>
      {text}
    </p>
  );
}

function Side({ title, children, testId }: { title: string; children: ReactNode; testId: string }) {
  return (
    <section aria-label={title} data-testid={testId}>
      <h2 className="mb-1 text-sm font-semibold tracking-widest text-ink-600 uppercase">{title}</h2>
      {/* tiles of 8.5rem or more: three abreast where they fit, else they wrap (a phone, a laptop with the sides abreast) */}
      <dl className="grid grid-cols-[repeat(auto-fit,minmax(8.5rem,1fr))] gap-3">{children}</dl>
    </section>
  );
}

export function Totals({ view, money }: { view: CardCheckView; money: Money }) {
  const { provider, jugline } = view;
  const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
  return (
    <div className="grid grid-cols-1 gap-4 2xl:grid-cols-[1fr_1fr_auto]">
      <Side title="Card service" testId="provider-totals">
        {provider ? (
          <>
            <Tile label="Charged" value={money(provider.chargedCents)} hint={count(provider.charges, 'charge', 'charges')} />
            <Tile label="Refunded" value={money(provider.refundedCents)} hint={count(provider.refunds, 'refund', 'refunds')} />
            <Tile label="Net" value={money(provider.netCents)} hint="charged less refunded" />
          </>
        ) : (
          <div className="col-span-full rounded-xl border border-steam-200 bg-white px-4 py-3">
            <dt className="text-sm font-semibold tracking-widest text-ink-600 uppercase">Not checked</dt>
            <dd className="text-lg">{view.providerNote}</dd>
          </div>
        )}
      </Side>
      <Side title="Jugline" testId="jugline-totals">
        <Tile label="Charged" value={money(jugline.chargedCents)} hint={`${money(jugline.recordedCents)} on orders`} />
        <Tile label="Refunded" value={money(jugline.refundedCents)} hint={`${money(jugline.givenBackCents)} given back automatically`} />
        <Tile label="Net" value={money(jugline.netCents)} hint="charged less refunded" />
      </Side>
      <Side title="Difference" testId="difference">
        <Tile
          label="Card service − Jugline"
          value={view.differenceCents === null ? '—' : money(view.differenceCents)}
          hint={view.differenceCents === 0 ? 'none' : 'to explain'}
        />
      </Side>
    </div>
  );
}

function MatchCell({ match, note }: { match: Match; note: CheckNote }) {
  const { mark, word } = MATCH_WORD[match];
  return (
    <td className={tdClass}>
      <span className={cn('mr-2 font-semibold whitespace-nowrap', match === 'mismatch' && 'rounded bg-alert-ink px-1.5 text-alert-deep')}>
        <span aria-hidden>{mark} </span>
        {word}
      </span>
      <span className="text-ink-600">{CHECK_NOTES[note]}</span>
    </td>
  );
}

const rowClass = (match: Match) => cn(match === 'mismatch' && 'border-l-8 border-alert-deep bg-alert-ink/20');
const orderLabel = (n: number | null) => (n === null ? '—' : `#${n}`);

interface Line {
  at: string;
  orderNumber: number | null;
  amountCents: number;
  match: Match;
  note: CheckNote;
  providerId: string | null;
}

/** Time, order and amount, the columns of this kind of line, then how it stands. */
function LinesPanel<T extends Line>(props: {
  title: string;
  empty: string;
  kind: 'charge' | 'refund';
  lines: T[];
  columns: [string, (line: T) => ReactNode][];
  keyOf: (line: T) => string;
  money: Money;
  time: (iso: string) => string;
}) {
  const { lines, columns, money, time } = props;
  return (
    <Panel title={props.title}>
      {lines.length === 0 ? (
        <p className="text-base text-ink-600">{props.empty}</p>
      ) : (
        <ScrollBox label={`${props.title} table`}>
          <table className="w-full text-base" data-testid={`${props.kind}-lines`}>
            <thead>
              <tr>
                <th className={thClass}>Time</th>
                <th className={thClass}>Order</th>
                <th className={cn(thClass, 'text-right')}>Amount</th>
                {columns.map(([header]) => (
                  <th key={header} className={thClass}>
                    {header}
                  </th>
                ))}
                <th className={thClass}>How it stands</th>
              </tr>
            </thead>
            <tbody>
              {lines.map((line) => (
                <tr key={props.keyOf(line)} className={rowClass(line.match)} data-testid={`${props.kind}-line`} data-match={line.match}>
                  <td className={cn(tdClass, 'whitespace-nowrap')} suppressHydrationWarning>
                    {time(line.at)}
                  </td>
                  <td className={tdClass}>{orderLabel(line.orderNumber)}</td>
                  <td className={cn(tdClass, numClass)}>{money(line.amountCents)}</td>
                  {columns.map(([header, cell]) => (
                    <td key={header} className={tdClass}>
                      {cell(line)}
                    </td>
                  ))}
                  <MatchCell match={line.match} note={line.note} />
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollBox>
      )}
    </Panel>
  );
}

export function ChargeTable({ lines, money, time }: { lines: CardCheckCharge[]; money: Money; time: (iso: string) => string }) {
  return (
    <LinesPanel
      title="Charges"
      empty="No card charges on this day."
      kind="charge"
      lines={lines}
      keyOf={(c) => `${c.providerId}-${c.paymentId}`}
      columns={[
        ['Card service', (c) => (c.providerStatus ? PROVIDER_WORD[c.providerStatus] : '—')],
        ['Jugline', (c) => (c.juglineStatus ? JUGLINE_WORD[c.juglineStatus] : 'No record')],
      ]}
      money={money}
      time={time}
    />
  );
}

export function RefundTable({ lines, money, time }: { lines: CardCheckRefund[]; money: Money; time: (iso: string) => string }) {
  return (
    <LinesPanel
      title="Refunds"
      empty="No card refunds on this day."
      kind="refund"
      lines={lines}
      keyOf={(r) => `${r.providerId}-${r.refundId}`}
      columns={[
        ['Reason', (r) => r.reason ?? '—'],
        ['By', (r) => (r.automatic ? 'Automatic' : (r.by ?? '—'))],
      ]}
      money={money}
      time={time}
    />
  );
}

export const moneyIn =
  (view: CardCheckView): Money =>
  (cents) =>
    formatCents(cents, view.currency, view.locale);
