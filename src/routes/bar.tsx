// The Bar: open drinks in milk lanes (in the menu's milk order), each lane oldest (or rushed)
// first, headed by its jug plan and shot plan. Bump by tap or by keyboard, as on a bump bar: keys
// sit only on cards in sight. Lanes off the screen's side are named in a signpost, never hidden.
import { useSuspenseQuery } from '@tanstack/react-query';
import { useEffect, useMemo, useRef, useState } from 'react';
import type { LoaderFunctionArgs } from 'react-router';
import { durationWords, ordinal } from '@/domain/format';
import { planBar, type PlannedLane } from '@/domain/lanes';
import { assignBumpKeys } from '@/domain/bump-keys';
import { ticketAgeSeconds } from '@/domain/tickets';
import { can } from '@/domain/roles';
import { RECALL_WINDOW_SECONDS } from '@/domain/timing';
import { Button } from '@/components/ui/button';
import { LinkStateBadge } from '@/components/ui/link-state';
import { StaffMenu } from '@/features/team/staff-menu';
import { barBoardQuery } from '@/queries/board';
import { useLiveBoard } from '@/live/use-live-board';
import { useBarCommand } from '@/features/bar/commands';
import { DrinkCard } from '@/features/bar/drink-card';
import { grams, LaneColumn, laneName } from '@/features/bar/lane-column';
import { ageLabel } from '@/features/bar/pour-line';
import { useScreenSight } from '@/features/bar/use-screen-sight';
import { useBumpKeys } from '@/features/bar/use-bump-keys';
import { sessionQuery } from '@/queries/session';
import { useApi } from '@/lib/api-context';
import { ApiError } from '@/lib/http';
import { useNow } from '@/lib/use-now';
import { requireScreen, type RouteDeps } from './deps';
import { EspressoStrip } from '@/features/dial-in/espresso-strip';
import { dialInQuery } from '@/queries/dial-in';
import { SCREENS } from '@/domain/screens';
import { SteamCaution } from '@/features/settings/steam-caution';
import { AllDayLine } from '@/features/bar/all-day-line';
import { NewTicketSound } from '@/features/bar/new-ticket-sound';

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
  const unit = board.location.volumeUnit ?? 'ml';
  const cards = plan.lanes.flatMap((l) => l.drinks);
  const openIds = useMemo(() => open.map((t) => t.id), [open]);
  const jugLabel = new Map<number, string>();
  for (const lane of plan.lanes) lane.jugPlan.forEach((b, j) => b.drinkIds.forEach((id, k) => jugLabel.set(id, `Jug ${j + 1} · pour ${ordinal(k + 1)}`)));

  // Tickets with a bump inside the recall window, newest first.
  const recallable = board.tickets
    .map((t) => ({ t, last: Math.max(0, ...t.drinks.map((d) => (d.doneAt ? Date.parse(d.doneAt) : 0))) }))
    .filter(({ last }) => last > 0 && now - last < RECALL_WINDOW_SECONDS * 1000)
    .sort((a, b) => b.last - a.last)
    .slice(0, 6)
    .map(({ t }) => t);

  const lanesRef = useRef<HTMLElement>(null);
  const sight = useScreenSight(lanesRef, plan.lanes.map((l) => `${l.key}:${l.drinks.map((d) => d.id).join('.')}`).join('|'));
  const [keys, setKeys] = useState<ReadonlyMap<number, number>>(() => new Map());
  useEffect(() => setKeys((prev) => assignBumpKeys(prev, sight.visible)), [sight.visible]);

  const [focusId, setFocusId] = useState<number | null>(null);
  useBumpKeys({ cards, keys, focusId, setFocusId, run: command.mutate, recallLast: recallable[0]?.id ?? null });

  const error = command.error instanceof ApiError ? command.error.message : null;
  return (
    <div className="on-dark flex min-h-screen flex-col bg-roast-950 text-crema-100 md:h-screen">
      <header className="flex flex-wrap items-center gap-x-6 gap-y-2 px-3 py-3 md:px-5">
        <h1 className="font-display text-4xl font-semibold tracking-wide">Bar</h1>
        <p className="text-2xl">
          <strong className="font-display text-4xl">{cards.length}</strong> drinks · <strong className="font-display text-4xl">{plan.shotPlan.shots}</strong>{' '}
          shots to pull · <span data-testid="coffee-needed">{grams(plan.shotPlan.doseDg)} coffee</span>
        </p>
        <p className="text-xl text-crema-300">Target {durationWords(target)}</p>
        {error && (
          <p role="alert" className="rounded-md bg-alert-ink px-3 py-1 text-lg font-semibold text-roast-950">
            {error}
          </p>
        )}
        <LinkStateBadge state={link} className="ml-auto text-xl" />
        <NewTicketSound ticketIds={openIds} />
        <StaffMenu dark />
      </header>

      <EspressoStrip seq={board.seq} />
      <AllDayLine drinks={cards} />

      <LanesOffScreen side="left" lanes={plan.lanes.filter((l) => sight.offLeft.includes(l.key))} nowMs={now} targetSeconds={target} />
      <LanesOffScreen side="right" lanes={plan.lanes.filter((l) => sight.offRight.includes(l.key))} nowMs={now} targetSeconds={target} />
      <main ref={lanesRef} className="flex min-h-0 flex-1 flex-col gap-3 px-3 pt-2 pb-3 md:flex-row md:gap-2 md:overflow-x-auto" aria-label="Milk lanes">
        {plan.lanes.length === 0 && <p className="m-auto font-display text-5xl text-crema-300">No drinks waiting</p>}
        {plan.lanes.map((lane) => (
          <LaneColumn
            key={lane.key}
            lane={lane}
            unit={unit}
            hiddenBelow={sight.hiddenBelow[lane.key] ?? 0}
            busy={command.isPending}
            onStartJug={(drinkIds) => command.mutate({ kind: 'start-jug', drinkIds })}
            onBumpJug={(jugId, drinkIds) => command.mutate({ kind: 'bump-jug', jugId, drinkIds })}
          >
            {lane.drinks.map((card) => (
              <DrinkCard
                key={card.id}
                card={card}
                unit={unit}
                nowMs={now}
                targetSeconds={target}
                keyNumber={keys.get(card.id) ?? null}
                jugLabel={jugLabel.get(card.id) ?? null}
                focused={focusId === card.id}
                busy={command.isPending}
                canRush={canRush}
                onStart={() => command.mutate({ kind: 'start-drink', id: card.id })}
                onBump={() => command.mutate({ kind: 'bump-drink', id: card.id })}
                onAcknowledge={() => command.mutate({ kind: 'acknowledge-allergy', id: card.id })}
                onRush={() => command.mutate({ kind: 'rush-ticket', id: card.ticketId })}
              />
            ))}
          </LaneColumn>
        ))}
      </main>

      {recallable.length > 0 && (
        <section aria-label="Just bumped" className="flex flex-wrap items-center gap-3 border-t border-crema-300/30 px-5 py-2">
          <h2 className="text-lg font-semibold tracking-widest text-crema-300 uppercase">Just bumped</h2>
          {recallable.map((t) => (
            <Button key={t.id} tone="dark" disabled={command.isPending} onClick={() => command.mutate({ kind: 'recall-ticket', id: t.id })}>
              Recall #{t.number} {t.customerName}
            </Button>
          ))}
        </section>
      )}

      <footer className="flex flex-wrap items-center gap-x-6 gap-y-1 bg-roast-850 px-3 py-2 text-lg text-crema-300 md:px-5">
        <span>
          Keys: <kbd className="font-semibold text-crema-100">1–9</kbd> bump card · <kbd className="font-semibold text-crema-100">← ↑ → ↓</kbd> move ·{' '}
          <kbd className="font-semibold text-crema-100">Enter</kbd> bump · <kbd className="font-semibold text-crema-100">S</kbd> start ·{' '}
          <kbd className="font-semibold text-crema-100">A</kbd> allergy read · <kbd className="font-semibold text-crema-100">R</kbd> recall last
        </span>
        <span className="md:ml-auto">
          <SteamCaution />
        </span>
      </footer>
    </div>
  );
}

/**
 * The lanes standing off one side of the screen (on a screen too narrow for every lane), named
 * with their drinks and the oldest age among them; a tap brings the first of them into view.
 */
function LanesOffScreen({ side, lanes, nowMs, targetSeconds }: { side: 'left' | 'right'; lanes: PlannedLane[]; nowMs: number; targetSeconds: number }) {
  if (lanes.length === 0) return null;
  const drinks = lanes.reduce((n, l) => n + l.drinkCount, 0);
  const oldest = lanes.reduce((m, l) => (l.oldestFiredAt < m ? l.oldestFiredAt : m), lanes[0].oldestFiredAt);
  const arrow = side === 'right' ? '→' : '←';
  const show = () =>
    document.querySelector(`[data-lane-key="${lanes[0].key}"]`)?.scrollIntoView({ inline: side === 'right' ? 'end' : 'start', block: 'nearest' });
  return (
    <button
      type="button"
      data-testid={side === 'right' ? 'lanes-hidden' : 'lanes-hidden-left'}
      onClick={show}
      className={`mx-3 mt-2 rounded-lg border-2 border-dashed border-crema-100 bg-roast-850 px-3 py-1 text-2xl font-semibold md:mx-5 ${side === 'right' ? 'self-end text-right' : 'self-start text-left'}`}
    >
      {arrow} {lanes.length} more lane{lanes.length === 1 ? '' : 's'} off screen: {lanes.map(laneName).join(', ')} · {drinks} drink{drinks === 1 ? '' : 's'} ·
      oldest {ageLabel(ticketAgeSeconds(oldest, nowMs), targetSeconds)} {arrow}
    </button>
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
