// The card check, for the lead and the owner: one café day's card money as the card service has it
// beside Jugline's payments and refunds, as a café checks its card batch at the end of the day.
// Every charge should be recorded against an order or given back; "Settle with the card service"
// asks about every line still open and applies the answer. Light theme, like Reports.
import { useMutation, useQuery, useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { data, Form, Link, useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { buttonStyles, Button } from '@/components/ui/button';
import type { CardCheckView } from '@/domain/card-check';
import { addDays } from '@/domain/freshness';
import { can } from '@/domain/roles';
import { SCREENS } from '@/domain/screens';
import { ChargeTable, moneyIn, openLines, RefundTable, Totals, Verdict } from '@/features/card-check/card-check-parts';
import { cardCheckKeys, cardCheckQuery } from '@/queries/card-check';
import { sessionQuery } from '@/queries/session';
import { useApi } from '@/lib/api-context';
import { cn } from '@/lib/cn';
import { send } from '@/lib/commands';
import { requireScreen, type RouteDeps } from './deps';

const DATE = /^\d{4}-\d{2}-\d{2}$/;
/** The ?date= of the address when it looks like a date (the server checks it is one). */
const dateFrom = (search: URLSearchParams) => {
  const d = search.get('date');
  return d && DATE.test(d) ? d : undefined;
};

function dayTitle(date: string, locale: string) {
  return new Intl.DateTimeFormat(locale, { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' }).format(
    new Date(`${date}T00:00:00Z`),
  );
}

function SettleButton({ view }: { view: CardCheckView }) {
  const qc = useQueryClient();
  const [search] = useSearchParams();
  const open = openLines(view);
  const settle = useMutation({
    mutationFn: () => send.settleCards({ date: view.date }),
    onSuccess: (next) => qc.setQueryData(cardCheckKeys.day(dateFrom(search)), next),
  });
  return (
    <div className="flex flex-wrap items-center gap-3">
      <Button onClick={() => settle.mutate()} disabled={settle.isPending || open === 0} data-testid="settle-cards">
        {settle.isPending ? 'Asking the card service…' : 'Settle with the card service'}
      </Button>
      <span className="text-base text-ink-600">
        {open === 0
          ? 'Nothing open to settle.'
          : 'Asks about each open line: a charge is recorded against its order, or given back if the order can’t take it.'}
      </span>
      {settle.isError && (
        <p role="alert" className="w-full font-semibold text-alert-deep">
          {settle.error.message}
        </p>
      )}
    </div>
  );
}

function CardCheck() {
  const api = useApi();
  const [search] = useSearchParams();
  const { data: view } = useSuspenseQuery(cardCheckQuery(api, dateFrom(search)));
  const { data: session } = useQuery(sessionQuery(api));
  const money = moneyIn(view);
  const time = useMemo(() => {
    const f = new Intl.DateTimeFormat(view.locale, { timeStyle: 'short', timeZone: view.timeZone });
    return (iso: string) => f.format(new Date(iso));
  }, [view.locale, view.timeZone]);
  const dayLink = (days: number) => `${SCREENS.cardCheck.path}?date=${addDays(view.date, days)}`;

  return (
    <div className="min-h-screen bg-steam-50 text-ink-900">
      <header className="flex flex-wrap items-center gap-x-6 gap-y-2 border-b border-steam-200 px-5 py-3">
        <h1 className="text-2xl font-semibold">Card check</h1>
        <p className="text-lg text-ink-600" data-testid="card-check-day">
          {dayTitle(view.date, view.locale)}
        </p>
        <Link to={SCREENS.reports.path} className="text-lg font-semibold underline">
          Reports
        </Link>
        <Link to="/" className="ml-auto text-lg font-semibold underline">
          Back to my screen
        </Link>
      </header>
      <main className="flex flex-col gap-4 p-5">
        <section aria-label="Day" className="flex flex-wrap items-end gap-3 rounded-xl border border-steam-200 bg-white p-4">
          <Link to={dayLink(-1)} className={buttonStyles({ tone: 'quiet' })}>
            <span aria-hidden>←</span> Day before
          </Link>
          <Form method="get" action={SCREENS.cardCheck.path} className="flex items-end gap-2">
            <label>
              <span className="mb-1 block text-sm font-semibold tracking-widest text-ink-600 uppercase">Date</span>
              <input
                type="date"
                name="date"
                defaultValue={view.date}
                required
                className="min-h-11 rounded-lg border border-steam-200 bg-white px-3 text-base text-ink-900"
              />
            </label>
            <button type="submit" className={buttonStyles({ tone: 'quiet' })}>
              Show
            </button>
          </Form>
          <Link to={dayLink(1)} className={buttonStyles({ tone: 'quiet' })}>
            Day after <span aria-hidden>→</span>
          </Link>
          <p className="ml-auto max-w-xl text-sm text-ink-600">
            Charges and refunds the card service made on this café day, set beside Jugline’s card payments and refunds. Every charge should be recorded against
            an order or given back.
          </p>
        </section>
        <Verdict view={view} money={money} />
        <Totals view={view} money={money} />
        {session?.user && can(session.user.role, 'refundOrders') && view.provider && <SettleButton view={view} />}
        <div className={cn('grid grid-cols-1 items-start gap-4 2xl:grid-cols-2')}>
          <ChargeTable lines={view.charges} money={money} time={time} />
          <RefundTable lines={view.refunds} money={money} time={time} />
        </div>
      </main>
    </div>
  );
}

export const cardCheckRoute = (deps: RouteDeps) => ({
  Component: CardCheck,
  handle: { title: 'Card check' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.cardCheck.need);
    try {
      await deps.queryClient.ensureQueryData(cardCheckQuery(deps.api, dateFrom(new URL(request.url).searchParams)));
    } catch (err) {
      // a date-shaped address that isn't on the calendar (2026-02-30)
      if ((err as { status?: number })?.status === 400) throw data({ message: 'There is no such date.' }, { status: 400, statusText: 'Bad Request' });
      throw err;
    }
    return null;
  },
});
