// The Pickup board for customers: first names and numbers only, "Being made" and "Ready". It is
// sent nothing more (src/domain/pickup.ts): its API, its live socket and its page's embedded data
// carry first name, number, status and ready time, whoever is signed in on it.
// On a wall (640 px and wider) both halves fill the screen and share its columns
// (src/domain/pickup-layout.ts): every name is shown whole or counted in "+n more". On a phone the
// halves stack and the page scrolls down, never sideways.
import { useSuspenseQuery } from '@tanstack/react-query';
import { useEffect, useRef, useState, type CSSProperties } from 'react';
import type { LoaderFunctionArgs } from 'react-router';
import type { PickupTicket } from '@/domain/pickup';
import { pickupLayout, type HalfLayout } from '@/domain/pickup-layout';
import { PICKUP_CAUTION } from '@/domain/cautions';
import { pickupBoard } from '@/domain/tickets';
import { LinkStateBadge } from '@/components/ui/link-state';
import { boardKeys, pickupBoardQuery } from '@/queries/board';
import { useLiveBoard } from '@/live/use-live-board';
import { useApi } from '@/lib/api-context';
import { cn } from '@/lib/cn';
import { useNow } from '@/lib/use-now';
import { requireScreen, type RouteDeps } from './deps';
import type { RouteHandle } from './root';
import { SCREENS } from '@/domain/screens';

/** A name that turned ready this recently gets the slow underline. */
const FRESH_MS = 20_000;
/** A name row, in names' em: the line plus room for the fresh underline. */
const ROW_EM = 1.3;
const GAP_EM = 0.15;
/** A column is at least this many names' em wide: a 7-letter name and its number at full size. */
const COLUMN_EM = 4.5;

/**
 * A name never shrinks by being cut: a long one gets a smaller size that fits its column (the
 * column is the size container), about 0.5 em a letter in the condensed face, with room kept
 * for the number.
 */
const nameSize = (name: string): CSSProperties => ({ fontSize: `min(1em, calc((100cqi - 1.6em) / ${(Math.max(name.length, 4) * 0.5).toFixed(2)}))` });

function NameRow({ t, fresh }: { t: PickupTicket; fresh?: boolean }) {
  return (
    <li data-testid="pickup-name" className="flex min-w-0 items-baseline gap-[0.2em] [container-type:inline-size]" style={{ height: `${ROW_EM}em` }}>
      <span className={cn('font-display leading-[1.1] font-semibold whitespace-nowrap', fresh && 'ready-fresh')} style={nameSize(t.firstName)}>
        {t.firstName}
      </span>
      {/* the number, and under it (in the room the number keeps) the word for a ticket being made again */}
      <span className="flex shrink-0 flex-col items-start font-display">
        <span className="text-[0.5em] text-crema-300">#{t.number}</span>
        {t.remake && (
          <span
            data-testid="pickup-remake"
            className="rounded border border-dashed border-crema-300 px-[0.15em] text-[0.2em] leading-tight tracking-wide uppercase"
          >
            remake
          </span>
        )}
      </span>
    </li>
  );
}

function Half({
  id,
  title,
  tickets,
  layout,
  rows,
  empty,
  fresh,
  muted,
  className,
}: {
  id: string;
  title: string;
  tickets: PickupTicket[];
  layout: HalfLayout | null;
  rows: number;
  empty: string;
  fresh?: (t: PickupTicket) => boolean;
  /** The heading in the quieter colour ("Being made"; "Ready" stands out). */
  muted?: boolean;
  className?: string;
}) {
  const shown = layout ? tickets.slice(0, layout.shown) : tickets;
  const more = layout?.more ?? 0;
  // on the wall names run down each column, then across
  const wall: CSSProperties | undefined = layout
    ? { gridTemplateColumns: `repeat(${layout.columns}, minmax(0, 1fr))`, gridTemplateRows: `repeat(${rows}, ${ROW_EM}em)`, gridAutoFlow: 'column' }
    : undefined;
  return (
    <section
      aria-labelledby={id}
      data-testid={`pickup-${id}`}
      className={cn('flex min-w-0 flex-col p-5 sm:min-h-0 sm:overflow-hidden sm:p-10', className)}
      style={layout ? { gridColumn: `span ${layout.columns}` } : undefined}
    >
      <h1 id={id} className={cn('font-display text-[0.6em] leading-tight font-semibold tracking-wide uppercase', muted && 'text-crema-300')}>
        {title} <span className="text-[0.6em] text-crema-300">({tickets.length})</span>
      </h1>
      <ul data-list className="mt-[0.2em] grid min-h-0 flex-1 gap-x-[0.4em] gap-y-[0.15em]" style={wall}>
        {shown.map((t) => (
          <NameRow key={t.id} t={t} fresh={fresh?.(t)} />
        ))}
        {more > 0 && (
          <li data-testid="pickup-more" className="flex items-center font-display text-[0.5em] font-semibold text-crema-300" style={{ height: `${ROW_EM}em` }}>
            +{more} more
          </li>
        )}
        {tickets.length === 0 && <li className="text-[0.35em] text-crema-300">{empty}</li>}
      </ul>
    </section>
  );
}

/**
 * The wall's room: columns across and name rows under a heading, measured once the page runs
 * (the server renders for 1920×1080). Null on a phone-width screen, where the halves stack.
 */
function useWallSpace() {
  const ref = useRef<HTMLDivElement>(null);
  const [space, setSpace] = useState<{ columns: number; rows: number } | null>({ columns: 4, rows: 6 });
  useEffect(() => {
    const measure = () => {
      const el = ref.current;
      if (!el) return;
      if (window.innerWidth < 640) return setSpace(null);
      const em = parseFloat(getComputedStyle(el).fontSize);
      const list = el.querySelector<HTMLElement>('[data-list]');
      const height = list?.clientHeight ?? 0;
      setSpace({
        columns: Math.max(2, Math.floor(el.clientWidth / (em * COLUMN_EM))),
        rows: Math.max(1, Math.floor((height + GAP_EM * em) / ((ROW_EM + GAP_EM) * em))),
      });
    };
    measure();
    window.addEventListener('resize', measure);
    return () => window.removeEventListener('resize', measure);
  }, []);
  return { ref, space };
}

function Pickup() {
  const { data: board } = useSuspenseQuery(pickupBoardQuery(useApi()));
  const link = useLiveBoard('pickup');
  const now = useNow(Date.parse(board.now));
  const { ref, space } = useWallSpace();
  const shown = board.tickets.filter((t) => pickupBoard(board.location.pickupTimeoutSeconds)(t, now));
  const making = shown.filter((t) => t.status === 'open');
  const ready = shown.filter((t) => t.status === 'ready').sort((a, b) => (b.readyAt ?? '').localeCompare(a.readyAt ?? ''));
  const layout = space ? pickupLayout(making.length, ready.length, space) : null;

  return (
    <div className="on-dark flex min-h-screen flex-col bg-roast-950 text-crema-100 sm:h-screen">
      <div
        ref={ref}
        className="grid flex-1 text-[2.5rem] sm:min-h-0 sm:grid-flow-col sm:grid-rows-1 sm:divide-x sm:divide-crema-300/30 sm:text-[clamp(2.5rem,min(8.9vh,6vw),6rem)]"
        style={layout ? { gridTemplateColumns: `repeat(${layout.making.columns + layout.ready.columns}, minmax(0, 1fr))` } : undefined}
      >
        <Half id="making" title="Being made" tickets={making} layout={layout?.making ?? null} rows={space?.rows ?? 0} empty="Nothing waiting" muted />
        <Half
          id="ready"
          title="Ready ✓"
          tickets={ready}
          layout={layout?.ready ?? null}
          rows={space?.rows ?? 0}
          empty="Nothing ready yet"
          fresh={(t) => now - Date.parse(t.readyAt ?? '') < FRESH_MS}
          className="bg-roast-850"
        />
      </div>
      <footer className="flex flex-wrap items-center gap-x-6 gap-y-1 px-5 py-3 text-lg text-crema-300 sm:px-10 sm:text-xl">
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
