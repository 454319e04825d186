// One live socket per screen. Every board query in the cache is kept current from it.
import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { applyEvent, pickupTicket, upsertTicket, type BoardFilter } from '../../domain/tickets';
import { isTicketEvent, type AnyLiveEvent, type BoardSnapshot, type LiveEvent, type MenuView, type TicketView } from '../../domain/types';
import type { Api } from '../../lib/api';
import { useApi } from '../../lib/api-context';
import { connectLive, liveUrl, type LinkState } from '../../lib/live-socket';
import { syncServerClock } from '../../lib/server-clock';
import { menuKeys } from '../menu/queries';
import { boardKeys } from './queries';

// Boards keep ready tickets for a while (recall tray, Pickup's "ready"); each screen hides them
// itself once its own time is up. Past this they are dropped so a day's tickets don't pile up.
const KEEP_READY_MS = 30 * 60_000;
const keepOnBoard: BoardFilter = (t, nowMs) =>
  t.status === 'open' || (t.status === 'ready' && t.readyAt !== null && nowMs - Date.parse(t.readyAt) < KEEP_READY_MS);

const boards: { key: readonly string[]; keep: BoardFilter; view: (t: TicketView) => TicketView }[] = [
  { key: boardKeys.bar, keep: keepOnBoard, view: (t) => t },
  { key: boardKeys.pickup, keep: keepOnBoard, view: pickupTicket },
];

function eachBoard(qc: QueryClient, fn: (b: BoardSnapshot, spec: (typeof boards)[number]) => BoardSnapshot) {
  for (const spec of boards) {
    const current = qc.getQueryData<BoardSnapshot>(spec.key);
    if (current) qc.setQueryData<BoardSnapshot>(spec.key, fn(current, spec));
  }
}

/**
 * The café's settings (the jug rules, wait target, pickup timeout) ride on the board
 * snapshot. After a settings change only the location is taken from a fresh snapshot: the
 * tickets stay as the socket keeps them, so no event that lands meanwhile is lost.
 */
async function refreshBoardLocation(qc: QueryClient, api: Api) {
  for (const spec of boards) {
    if (!qc.getQueryData(spec.key)) continue;
    const fresh = await (spec.key === boardKeys.pickup ? api.pickup() : api.tickets()).catch(() => null);
    if (fresh) qc.setQueryData<BoardSnapshot>(spec.key, (b) => b && { ...b, location: fresh.location });
  }
}

export function applyLiveEvent(qc: QueryClient, event: AnyLiveEvent, api?: Api) {
  if (isTicketEvent(event)) {
    eachBoard(qc, (b, spec) => applyEvent(b, { ...event, ticket: spec.view(event.ticket) } as LiveEvent, spec.keep));
    return;
  }
  if (event.type === 'menu.changed') {
    qc.invalidateQueries({ queryKey: menuKeys.all });
    if (api) void refreshBoardLocation(qc, api);
    eachBoard(qc, (b) => (event.seq > b.seq ? { ...b, seq: event.seq } : b));
    return;
  }
  if (event.type === 'shift.changed') {
    qc.invalidateQueries({ queryKey: ['pulse'] });
    eachBoard(qc, (b) => (event.seq > b.seq ? { ...b, seq: event.seq } : b));
    return;
  }
  // 86 / back on: the menu tile changes at once; the boards still move to this seq
  const { id, available } = event.item;
  qc.setQueryData<MenuView>(menuKeys.all, (menu) =>
    menu && { ...menu, items: menu.items.map((i) => (i.id === id ? { ...i, available } : i)) },
  );
  eachBoard(qc, (b) => (event.seq > b.seq ? { ...b, seq: event.seq } : b));
}

/** A command's answer shows at once; the event that follows changes nothing further. */
export function applyTicket(qc: QueryClient, ticket: TicketView) {
  eachBoard(qc, (b, spec) => upsertTicket(b, spec.view(ticket), spec.keep, Date.now()));
}

export function useLiveBoard(): LinkState {
  const qc = useQueryClient();
  const api = useApi();
  const [state, setState] = useState<LinkState>('connecting');
  useEffect(() => {
    const lastSeq = () =>
      Math.max(0, ...boards.map((b) => qc.getQueryData<BoardSnapshot>(b.key)?.seq ?? 0));
    return connectLive(liveUrl(window.location), {
      lastSeq,
      onState: setState,
      onEvent: (event) => {
        syncServerClock(event.at);
        applyLiveEvent(qc, event, api);
      },
      onSnapshot: (snapshot) => {
        syncServerClock(snapshot.now);
        qc.invalidateQueries({ queryKey: menuKeys.all }); // a snapshot carries no menu changes
        eachBoard(qc, (_b, spec) => ({
          ...snapshot,
          tickets: snapshot.tickets.filter((t) => spec.keep(t, Date.parse(snapshot.now))).map(spec.view),
        }));
      },
    });
  }, [qc, api]);
  return state;
}
