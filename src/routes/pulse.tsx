// Pulse: the shift lead's live board of ticket times against the target, and staffing.
import { useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import { lazy, Suspense, useEffect, useState } from 'react';
import type { LoaderFunctionArgs } from 'react-router';
import { durationWords, formatDuration } from '@/domain/format';
import { formatCents } from '@/domain/money';
import type { PulseView, WaitSummary } from '@/domain/pulse';
import { LinkStateBadge } from '@/components/ui/link-state';
import { StaffMenu } from '@/features/team/staff-menu';
import { barBoardQuery } from '@/queries/board';
import { useLiveBoard } from '@/live/use-live-board';
import { menuQuery } from '@/queries/menu';
import { pulseKeys, pulseQuery } from '@/queries/pulse';
import { ShiftPanel } from '@/features/pulse/shift-panel';
import { useApi } from '@/lib/api-context';
import { cn } from '@/lib/cn';
import { useHydrated } from '@/lib/use-hydrated';
import { requireScreen, type RouteDeps } from './deps';
import { SCREENS } from '@/domain/screens';
import { ScrollBox } from '@/components/ui/scroll-box';

const PulseChart = lazy(() => import('@/features/pulse/pulse-chart'));

/** m:ss, as the Reports write waits too. */
const min = formatDuration;
const pct = (x: number | null) => (x === null ? '—' : `${Math.round(x * 100)} %`);

/** The four numbers of a window, in café words; the statistics behind them in the help note below. */
function Numbers({ w, target }: { w: WaitSummary; target: number }) {
  const tiles = [
    { label: 'Half waited under', value: min(w.medianSeconds), over: (w.medianSeconds ?? 0) > target },
    { label: '9 in 10 waited under', value: min(w.p90Seconds), over: (w.p90Seconds ?? 0) > target },
    { label: `Over the ${min(target)} target`, value: pct(w.overTargetShare), over: false },
    { label: 'Tickets done', value: String(w.count), over: false },
  ];
  return (
    <div className="grid grid-cols-2 gap-3 sm:gap-4 lg:grid-cols-4">
      {tiles.map((t) => (
        <div key={t.label} data-testid="pulse-number" className="min-w-0 rounded-2xl border border-steam-200 bg-white p-3 sm:p-4">
          <p className="text-sm font-semibold tracking-wide text-ink-600 uppercase sm:text-base sm:tracking-widest">{t.label}</p>
          <p className={cn('font-display text-5xl font-semibold sm:text-6xl', t.over && 'underline decoration-copper-700 decoration-4')}>{t.value}</p>
          {t.over && <p className="text-sm font-semibold text-copper-700">over the target</p>}
        </div>
      ))}
    </div>
  );
}

function Table({ caption, head, rows }: { caption: string; head: string[]; rows: (string | number)[][] }) {
  return (
    // a phone scrolls a wide table inside its own box, never the page
    <ScrollBox label={caption}>
      <table className="w-full text-left text-base sm:text-lg">
        <caption className="mb-1 text-left text-base font-semibold tracking-widest text-ink-600 uppercase">{caption}</caption>
        <thead>
          <tr className="border-b border-steam-200">
            {head.map((h) => (
              <th key={h} className="py-1 pr-3 font-semibold">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.length === 0 && (
            <tr>
              <td colSpan={head.length} className="py-2 text-ink-600">
                Nothing yet
              </td>
            </tr>
          )}
          {rows.map((r, i) => (
            <tr key={i} className="border-b border-steam-100">
              {r.map((c, j) => (
                <td key={j} className="py-1 pr-3">
                  {c}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollBox>
  );
}

const drinksWord = (n: number) => (n === 1 ? '1 drink' : `${n} drinks`);

/** The staffing sentence, what it was worked out from in café words, and the method in a help note. */
function Staffing({ staffing: { sentence, inputs } }: { staffing: PulseView['staffing'] }) {
  const pace = inputs.drinksTimed
    ? `the bar's pace over the last ${inputs.paceMinutes} min (about ${durationWords(inputs.meanMakeSeconds)} a drink for each barista, from ${drinksWord(inputs.drinksTimed)} bumped)`
    : `${durationWords(inputs.meanMakeSeconds)} a drink for each barista (nothing bumped in the last ${inputs.paceMinutes} min yet)`;
  return (
    <section aria-label="Staffing" className="mt-4 rounded-2xl border-2 border-ink-900 bg-white p-4">
      <p data-testid="staffing" className="text-xl font-semibold sm:text-2xl">
        {sentence}
      </p>
      <p data-testid="staffing-inputs" className="mt-1 text-base text-ink-600">
        From {drinksWord(inputs.arrivals)} fired in the last {inputs.windowMinutes} min and {pace}, with {inputs.baristas} on bar. A guide, not a promise.
      </p>
      <details className="mt-1 text-base text-ink-600">
        <summary className="cursor-pointer font-semibold">How we work this out</summary>
        <p className="mt-1">
          The pace: the time the baristas had drinks to make, over the drinks they bumped (Little's law), so a jug started a moment before its bump doesn't read
          as seconds a drink; with only a few drinks bumped it leans on 60 s a drink. The wait now: the drinks on the bar and this one, shared among the
          baristas at that pace, the same sum the Counter quotes.
        </p>
        <p className="mt-1">
          Keeping up: the bar is treated as a queue with several servers (the M/M/c model, Erlang C): drinks arrive at random at the rate of the last{' '}
          {inputs.windowMinutes} min and take the pace's time give or take. It keeps up only while the drinks coming in need fewer baristas than are on bar,
          decided on the exact counts, not rounded. When the bar has more drinks on it than the model expects, the sentence says the wait now instead.
        </p>
      </details>
    </section>
  );
}

/** Pulse refreshes its numbers whenever the live board moves (debounced). */
function useRefreshOnEvents(seq: number) {
  const qc = useQueryClient();
  useEffect(() => {
    const t = setTimeout(() => qc.invalidateQueries({ queryKey: pulseKeys.all }), 400);
    return () => clearTimeout(t);
  }, [seq, qc]);
}

function Pulse() {
  const api = useApi();
  const { data: p } = useSuspenseQuery(pulseQuery(api));
  const { data: board } = useSuspenseQuery(barBoardQuery(api));
  const { data: menu } = useSuspenseQuery(menuQuery(api));
  const link = useLiveBoard();
  useRefreshOnEvents(board.seq);
  const hydrated = useHydrated();
  const [windowIndex, setWindowIndex] = useState(1);
  const w = p.windows[windowIndex];
  return (
    <div className="min-h-screen bg-steam-50 p-3 text-ink-900 sm:p-5">
      <header className="flex flex-wrap items-center gap-x-5 gap-y-2">
        <h1 className="text-3xl font-semibold">Pulse</h1>
        <span className="text-lg text-ink-600">{menu.location.name}</span>
        <span className="text-lg">Target {durationWords(p.targetSeconds)}</span>
        <span data-testid="wait-now" className="text-lg">
          Wait now <strong>~{Math.max(1, Math.ceil(p.staffing.waitNow.seconds / 60))} min</strong> ({drinksWord(p.staffing.waitNow.drinksOnBar)} on the bar)
        </span>
        {p.tipsToday && (
          // the staff's money so far today, apart from the café's takings
          <span data-testid="tips-today" className="text-lg">
            Tips today <strong>{formatCents(p.tipsToday.cents, menu.location.currency)}</strong> (cash{' '}
            {formatCents(p.tipsToday.cashCents, menu.location.currency)} · card {formatCents(p.tipsToday.cardCents, menu.location.currency)})
          </span>
        )}
        <LinkStateBadge state={link} className="ml-auto" />
        <StaffMenu />
      </header>
      {p.alert && (
        <p role="alert" className="mt-3 rounded-xl border-2 border-ink-900 bg-alert-ink px-4 py-3 text-xl font-semibold">
          ⚠ {p.alert}
        </p>
      )}
      {(p.beanAlerts ?? []).length > 0 && (
        <section aria-label="Coffee" className="mt-3 flex flex-wrap gap-2">
          {p.beanAlerts.map((a) => (
            <p
              key={`${a.lotId}-${a.kind}`}
              data-testid="bean-alert"
              className={cn('rounded-xl border-2 border-ink-900 px-4 py-2 text-lg', a.kind === 'fading' ? 'bg-white' : 'bg-alert-ink')}
            >
              <span aria-hidden>{a.kind === 'fading' ? '↘' : a.kind === 'low' ? '▼' : '✕'} </span>
              <strong>{a.kind === 'fading' ? 'Fading' : a.kind === 'low' ? 'Low stock' : 'Empty'}:</strong> {a.message}
            </p>
          ))}
        </section>
      )}
      <div className="mt-4">
        <ShiftPanel shift={p.shift} expectedCashCents={p.expectedCashCents} currency={menu.location.currency} timeZone={menu.location.timeZone} />
      </div>
      <div role="tablist" aria-label="Time window" className="mt-4 flex flex-wrap gap-2">
        {p.windows.map((x, i) => (
          <button
            key={x.label}
            role="tab"
            aria-selected={i === windowIndex}
            onClick={() => setWindowIndex(i)}
            className={cn(
              'min-h-11 rounded-lg border-2 px-4 font-semibold',
              i === windowIndex ? 'border-ink-900 bg-ink-900 text-steam-50' : 'border-steam-200 bg-white',
            )}
          >
            {x.label}
          </button>
        ))}
        <span className="self-center text-lg sm:ml-4">
          <strong data-testid="drinks-per-15">{w.drinksPer15}</strong> {w.drinksPer15 === 1 ? 'drink' : 'drinks'} per 15 min
        </span>
      </div>
      <div className="mt-3">
        <Numbers w={w.waits} target={p.targetSeconds} />
        <details className="mt-1 text-sm text-ink-600">
          <summary className="cursor-pointer font-semibold">How we work this out</summary>
          <p className="mt-1">
            A ticket's wait runs from when it reached the bar (paid) to when its last drink was bumped. "Half waited under" is the median, "9 in 10 waited
            under" the 90th percentile, both by {p.percentileMethod}.
          </p>
        </details>
      </div>
      <Staffing staffing={p.staffing} />
      <section aria-label="Waits and arrivals per 15 minutes" className="mt-4 rounded-2xl border border-steam-200 bg-white p-4">
        {hydrated ? (
          <Suspense fallback={<p className="h-[460px]">Loading the chart…</p>}>
            <PulseChart buckets={p.buckets} targetSeconds={p.targetSeconds} timeZone={menu.location.timeZone} />
          </Suspense>
        ) : (
          <p className="h-[460px]">Loading the chart…</p>
        )}
      </section>
      <div className="mt-4 grid grid-cols-1 gap-6 lg:grid-cols-2">
        <Table
          caption="Open tickets, oldest first"
          head={['#', 'Name', 'Waiting', 'Drinks left', 'Making']}
          rows={p.open.map((t) => [`#${t.number}`, t.customerName, min(t.ageSeconds), `${t.drinksLeft} of ${t.drinks}`, t.makers.join(', ') || '—'])}
        />
        <Table
          caption={`Quote vs actual (${p.windows[3].label.toLowerCase()})`}
          head={['Tickets', 'Told (average)', 'Waited (average)', 'Longer than told']}
          rows={[
            [p.quoteVsActual.count, min(p.quoteVsActual.meanQuotedSeconds), min(p.quoteVsActual.meanActualSeconds), pct(p.quoteVsActual.shareLongerThanQuoted)],
          ]}
        />
        <Table
          caption="Per barista (bumped by)"
          head={['Barista', 'Drinks', 'Half made within']}
          rows={p.perBarista.map((b) => [b.name, b.drinks, min(b.medianMakeSeconds)])}
        />
        <Table
          caption="Per category"
          head={['Category', 'Drinks', 'Half made within']}
          rows={p.perCategory.map((c) => [c.category, c.drinks, min(c.medianMakeSeconds)])}
        />
        <p className="text-sm text-ink-600 lg:col-span-2">
          A drink's make time: from its barista's previous bump (or from when it reached the bar, if that was later) to its bump, shared among the drinks bumped
          together — start taps aren't used, so a jug of 4 started a moment before its bump doesn't read as seconds a drink. A drink bumped in the same moment
          as another by the same barista gets no time of its own.
        </p>
      </div>
    </div>
  );
}

export const pulseRoute = (deps: RouteDeps) => ({
  Component: Pulse,
  handle: { title: 'Pulse' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.pulse.need);
    await Promise.all([
      deps.queryClient.ensureQueryData(pulseQuery(deps.api)),
      deps.queryClient.ensureQueryData(barBoardQuery(deps.api)),
      deps.queryClient.ensureQueryData(menuQuery(deps.api)),
    ]);
    return null;
  },
});
