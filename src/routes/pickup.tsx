// The Pickup board for customers: first names and numbers only, "Being made" and "Ready". It is
// sent nothing more (src/domain/pickup.ts): its API, its live socket and its page's embedded data
// carry first name, number, status and ready time, whoever is signed in on it.
import { useSuspenseQuery } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router';
import type { PickupTicket } from '../domain/pickup';
import { PICKUP_CAUTION } from '../domain/cautions';
import { pickupBoard } from '../domain/tickets';
import { LinkStateBadge } from '../components/ui/link-state';
import { boardKeys, pickupBoardQuery } from '../features/board/queries';
import { useLiveBoard } from '../features/board/use-live-board';
import { useApi } from '../lib/api-context';
import { cn } from '../lib/cn';
import { useNow } from '../lib/use-now';
import { requireScreen, type RouteDeps } from './deps';
import type { RouteHandle } from './root';
import { SCREENS } from '../domain/screens';

/** A name that turned ready this recently gets the slow underline. */
const FRESH_MS = 20_000;

function NameRow({ t, fresh }: { t: PickupTicket; fresh?: boolean }) {
  return (
    // min-w-0 + truncate: a long name is cut with "…" and never pushes the number out of sight
    <li data-testid="pickup-name" className="flex min-w-0 items-baseline gap-5">
      <span title={t.firstName} className={cn('min-w-0 truncate font-display text-8xl leading-tight font-semibold', fresh && 'ready-fresh')}>
        {t.firstName}
      </span>
      <span className="shrink-0 font-display text-5xl text-crema-300">#{t.number}</span>
    </li>
  );
}

function Pickup() {
  const { data: board } = useSuspenseQuery(pickupBoardQuery(useApi()));
  const link = useLiveBoard('pickup');
  const now = useNow(Date.parse(board.now));
  const shown = board.tickets.filter((t) => pickupBoard(board.location.pickupTimeoutSeconds)(t, now));
  const making = shown.filter((t) => t.status === 'open');
  const ready = shown
    .filter((t) => t.status === 'ready')
    .sort((a, b) => (b.readyAt ?? '').localeCompare(a.readyAt ?? ''));

  return (
    <div className="on-dark flex h-screen flex-col bg-roast-950 text-crema-100">
      <div className="grid min-h-0 flex-1 grid-cols-2 divide-x divide-crema-300/30">
        <section aria-labelledby="making" className="overflow-hidden p-10">
          <h1 id="making" className="font-display text-6xl font-semibold uppercase tracking-wide text-crema-300">
            Being made
          </h1>
          <ul className="mt-8 grid grid-cols-2 gap-x-10 gap-y-4">
            {making.map((t) => (
              <NameRow key={t.id} t={t} />
            ))}
          </ul>
        </section>
        <section aria-labelledby="ready" className="overflow-hidden bg-roast-850 p-10">
          <h1 id="ready" className="font-display text-6xl font-semibold uppercase tracking-wide">
            Ready ✓
          </h1>
          <ul className="mt-8 grid grid-cols-2 gap-x-10 gap-y-4">
            {ready.map((t) => (
              <NameRow key={t.id} t={t} fresh={now - Date.parse(t.readyAt ?? '') < FRESH_MS} />
            ))}
          </ul>
        </section>
      </div>
      <footer className="flex items-center gap-6 px-10 py-3 text-xl text-crema-300">
        <span>{board.location.name}</span>
        <span>{PICKUP_CAUTION}</span>
        <LinkStateBadge state={link} className="ml-auto" />
      </footer>
    </div>
  );
}

export const pickupRoute = (deps: RouteDeps) => ({
  Component: Pickup,
  // the page embeds the board only: not the session, which names the person signed in
  handle: { title: 'Pickup', embed: [boardKeys.pickup] } satisfies RouteHandle,
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.pickup.need);
    await deps.queryClient.ensureQueryData(pickupBoardQuery(deps.api));
    return null;
  },
});
