// The Bar: open drinks in milk lanes, by shot count, oldest (or rushed) first, each lane headed by
// its jug plan and shot plan. Bump by tap or by keyboard, as on a bump bar.
import { useSuspenseQuery } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import type { LoaderFunctionArgs } from 'react-router';
import { durationWords, ordinal } from '../domain/format';
import { planBar } from '../domain/lanes';
import { can } from '../domain/roles';
import { RECALL_WINDOW_SECONDS } from '../domain/timing';
import { Button } from '../components/ui/button';
import { LinkStateBadge } from '../components/ui/link-state';
import { StaffMenu } from '../components/ui/staff-menu';
import { barBoardQuery } from '../features/board/queries';
import { useLiveBoard } from '../features/board/use-live-board';
import { useBarCommand } from '../features/bar/commands';
import { DrinkCard } from '../features/bar/drink-card';
import { grams, LaneColumn } from '../features/bar/lane-column';
import { useBumpKeys } from '../features/bar/use-bump-keys';
import { sessionQuery } from '../features/session/queries';
import { useApi } from '../lib/api-context';
import { ApiError } from '../lib/http';
import { useNow } from '../lib/use-now';
import { requireScreen, type RouteDeps } from './deps';
import { EspressoStrip } from '../features/dial-in/espresso-strip';
import { dialInQuery } from '../features/dial-in/queries';
import { SCREENS } from '../domain/screens';
import { SteamCaution } from '../features/settings/steam-caution';


function Bar() {
  const api = useApi();
  const { data: board } = useSuspenseQuery(barBoardQuery(api));
  const { data: session } = useSuspenseQuery(sessionQuery(api));
  const link = useLiveBoard();
  const now = useNow(Date.parse(board.now));
  const command = useBarCommand();
  const target = board.location.waitTargetSeconds;
  const canRush = can(session.user?.role, 'rushTickets');

  const open = useMemo(() => board.tickets.filter((t) => t.status === 'open'), [board.tickets]);
  const plan = useMemo(() => planBar(open, board.location.jugRules), [open, board.location]);
  const cards = plan.lanes.flatMap((l) => l.groups.flatMap((g) => g.drinks));
  const jugLabel = new Map<number, string>();
  for (const lane of plan.lanes)
    lane.jugPlan.forEach((b, j) => b.drinkIds.forEach((id, k) => jugLabel.set(id, `Jug ${j + 1} · pour ${ordinal(k + 1)}`)));

  // Tickets with a bump inside the recall window, newest first.
  const recallable = board.tickets
    .map((t) => ({ t, last: Math.max(0, ...t.drinks.map((d) => (d.doneAt ? Date.parse(d.doneAt) : 0))) }))
    .filter(({ last }) => last > 0 && now - last < RECALL_WINDOW_SECONDS * 1000)
    .sort((a, b) => b.last - a.last)
    .slice(0, 6)
    .map(({ t }) => t);

  const [focusId, setFocusId] = useState<number | null>(null);
  useBumpKeys({ cards, focusId, setFocusId, run: command.mutate, recallLast: recallable[0]?.id ?? null });

  const error = command.error instanceof ApiError ? command.error.message : null;
  return (
    <div className="on-dark flex h-screen flex-col bg-roast-950 text-crema-100">
      <header className="flex items-center gap-6 px-5 py-3">
        <h1 className="font-display text-4xl font-semibold tracking-wide">Bar</h1>
        <p className="text-2xl">
          <strong className="font-display text-4xl">{cards.length}</strong> drinks ·{' '}
          <strong className="font-display text-4xl">{plan.shotPlan.shots}</strong> shots to pull ·{' '}
          <span data-testid="coffee-needed">{grams(plan.shotPlan.doseDg)} coffee</span>
        </p>
        <p className="text-xl text-crema-300">Target {durationWords(target)}</p>
        {error && (
          <p role="alert" className="rounded-md bg-alert-ink px-3 py-1 text-lg font-semibold text-roast-950">
            {error}
          </p>
        )}
        <LinkStateBadge state={link} className="ml-auto text-xl" />
        <StaffMenu dark />
      </header>

      <EspressoStrip seq={board.seq} />

      <main className="flex flex-1 gap-4 overflow-x-auto px-5 pb-3" aria-label="Milk lanes">
        {plan.lanes.length === 0 && <p className="m-auto font-display text-5xl text-crema-300">No drinks waiting</p>}
        {plan.lanes.map((lane) => (
          <LaneColumn
            key={lane.key}
            lane={lane}
            narrow={plan.lanes.length > 4}
            busy={command.isPending}
            onStartJug={(drinkIds) => command.mutate({ kind: 'start-jug', drinkIds })}
            onBumpJug={(jugId, drinkIds) => command.mutate({ kind: 'bump-jug', jugId, drinkIds })}
          >
            {(group) =>
              group.drinks.map((card) => (
                <DrinkCard
                  key={card.id}
                  card={card}
                  nowMs={now}
                  targetSeconds={target}
                  keyNumber={cards.indexOf(card) < 9 ? cards.indexOf(card) + 1 : null}
                  jugLabel={jugLabel.get(card.id) ?? null}
                  focused={focusId === card.id}
                  busy={command.isPending}
                  canRush={canRush}
                  onStart={() => command.mutate({ kind: 'start-drink', id: card.id })}
                  onBump={() => command.mutate({ kind: 'bump-drink', id: card.id })}
                  onAcknowledge={() => command.mutate({ kind: 'acknowledge-allergy', id: card.id })}
                  onRush={() => command.mutate({ kind: 'rush-ticket', id: card.ticketId })}
                />
              ))
            }
          </LaneColumn>
        ))}
      </main>

      {recallable.length > 0 && (
        <section aria-label="Just bumped" className="flex items-center gap-3 border-t border-crema-300/30 px-5 py-2">
          <h2 className="text-lg font-semibold tracking-widest text-crema-300 uppercase">Just bumped</h2>
          {recallable.map((t) => (
            <Button key={t.id} tone="dark" disabled={command.isPending} onClick={() => command.mutate({ kind: 'recall-ticket', id: t.id })}>
              Recall #{t.number} {t.customerName}
            </Button>
          ))}
        </section>
      )}

      <footer className="flex items-center gap-6 bg-roast-850 px-5 py-2 text-lg text-crema-300">
        <span>
          Keys: <kbd className="font-semibold text-crema-100">1–9</kbd> bump card · <kbd className="font-semibold text-crema-100">← ↑ → ↓</kbd>{' '}
          move · <kbd className="font-semibold text-crema-100">Enter</kbd> bump · <kbd className="font-semibold text-crema-100">S</kbd> start ·{' '}
          <kbd className="font-semibold text-crema-100">A</kbd> allergy read · <kbd className="font-semibold text-crema-100">R</kbd> recall last
        </span>
        <span className="ml-auto">
          <SteamCaution />
        </span>
      </footer>
    </div>
  );
}

export const barRoute = (deps: RouteDeps) => ({
  Component: Bar,
  // With scripts off (a wall screen that can't run them), the page still refreshes itself.
  handle: { title: 'Bar', head: '<noscript><meta http-equiv="refresh" content="10"></noscript>' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.bar.need);
    // side by side; the grinder strip is extra: prefetch never throws, so it can't keep the Bar from loading
    await Promise.all([deps.queryClient.ensureQueryData(barBoardQuery(deps.api)), deps.queryClient.prefetchQuery(dialInQuery(deps.api))]);
    return null;
  },
});
