// The Bar: open drinks in milk lanes, by shot count, oldest first; bump by tap or number key.
import { useSuspenseQuery } from '@tanstack/react-query';
import { useEffect, useMemo } from 'react';
import type { LoaderFunctionArgs } from 'react-router';
import { groupIntoLanes } from '../domain/lanes';
import { RECALL_WINDOW_SECONDS } from '../domain/timing';
import { Button } from '../components/ui/button';
import { LinkStateBadge } from '../components/ui/link-state';
import { barBoardQuery } from '../features/board/queries';
import { useLiveBoard } from '../features/board/use-live-board';
import { useBarCommand } from '../features/bar/commands';
import { DrinkCard } from '../features/bar/drink-card';
import { LaneColumn } from '../features/bar/lane-column';
import { useApi } from '../lib/api-context';
import { ApiError } from '../lib/http';
import { useNow } from '../lib/use-now';
import { requireScreen, type RouteDeps } from './deps';

function Bar() {
  const { data: board } = useSuspenseQuery(barBoardQuery(useApi()));
  const link = useLiveBoard();
  const now = useNow(Date.parse(board.now));
  const command = useBarCommand();
  const target = board.location.waitTargetSeconds;

  const open = useMemo(() => board.tickets.filter((t) => t.status === 'open'), [board.tickets]);
  const lanes = useMemo(() => groupIntoLanes(open), [open]);
  const cards = lanes.flatMap((l) => l.groups.flatMap((g) => g.drinks));
  const keyOf = new Map(cards.slice(0, 9).map((c, i) => [c.id, i + 1]));
  const shots = cards.reduce((n, c) => n + c.shots, 0);
  // Tickets with a bump inside the recall window, newest first.
  const recallable = board.tickets
    .map((t) => ({ t, last: Math.max(0, ...t.drinks.map((d) => (d.doneAt ? Date.parse(d.doneAt) : 0))) }))
    .filter(({ last }) => last > 0 && now - last < RECALL_WINDOW_SECONDS * 1000)
    .sort((a, b) => b.last - a.last)
    .slice(0, 6)
    .map(({ t }) => t);

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.altKey || e.ctrlKey || e.metaKey || (e.target as HTMLElement)?.tagName === 'INPUT') return;
      const n = Number(e.key);
      if (n >= 1 && n <= 9 && cards[n - 1]) command.mutate({ kind: 'bump-drink', id: cards[n - 1].id });
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [cards, command]);

  const error = command.error instanceof ApiError ? command.error.message : null;

  return (
    <div className="on-dark flex h-screen flex-col bg-roast-950 text-crema-100">
      <header className="flex items-center gap-6 px-5 py-3">
        <h1 className="font-display text-4xl font-semibold tracking-wide">Bar</h1>
        <p className="text-2xl">
          <strong className="font-display text-4xl">{cards.length}</strong> drinks ·{' '}
          <strong className="font-display text-4xl">{shots}</strong> shots waiting
        </p>
        <p className="text-xl text-crema-300">Target {Math.round(target / 60)} min</p>
        {error && (
          <p role="alert" className="rounded-md bg-alert-ink px-3 py-1 text-lg font-semibold text-roast-950">
            {error}
          </p>
        )}
        <LinkStateBadge state={link} className="ml-auto text-xl" />
      </header>

      <main className="flex flex-1 gap-4 overflow-x-auto px-5 pb-3" aria-label="Milk lanes">
        {lanes.length === 0 && (
          <p className="m-auto font-display text-5xl text-crema-300">No drinks waiting</p>
        )}
        {lanes.map((lane) => (
          <LaneColumn key={lane.key} lane={lane}>
            {(group) =>
              group.drinks.map((card) => (
                <DrinkCard
                  key={card.id}
                  card={card}
                  nowMs={now}
                  targetSeconds={target}
                  keyNumber={keyOf.get(card.id) ?? null}
                  busy={command.isPending}
                  onStart={() => command.mutate({ kind: 'start-drink', id: card.id })}
                  onBump={() => command.mutate({ kind: 'bump-drink', id: card.id })}
                />
              ))
            }
          </LaneColumn>
        ))}
      </main>

      {recallable.length > 0 && (
        <section aria-label="Just bumped" className="flex items-center gap-3 border-t border-crema-300/30 px-5 py-2">
          <h2 className="text-lg font-semibold uppercase tracking-widest text-crema-300">Just bumped</h2>
          {recallable.map((t) => (
            <Button
              key={t.id}
              tone="dark"
              disabled={command.isPending}
              onClick={() => command.mutate({ kind: 'recall-ticket', id: t.id })}
            >
              Recall #{t.number} {t.customerName}
            </Button>
          ))}
        </section>
      )}

      <footer className="flex items-center gap-6 bg-roast-850 px-5 py-2 text-lg text-crema-300">
        <span>
          Keys <kbd className="font-semibold text-crema-100">1–9</kbd> bump the numbered card
        </span>
        <span className="ml-auto">
          Caution: steam and milk above about 70 °C scald and burn — purge and wipe the wand; follow your local food code.
        </span>
      </footer>
    </div>
  );
}

export const barRoute = (deps: RouteDeps) => ({
  Component: Bar,
  handle: { title: 'Bar' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, 'makeDrinks');
    await deps.queryClient.ensureQueryData(barBoardQuery(deps.api));
    return null;
  },
});
