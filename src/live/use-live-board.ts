// One live socket per screen. Every board query in the cache is kept current from it.
// A staff screen's socket carries full events and keeps both boards (the Pickup board from the
// same events, in its shape). The Pickup screen's socket carries Pickup-shaped events only
// (src/domain/pickup.ts): it keeps the Pickup board and nothing else.
import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { applyPickupEvent, pickupEvent, pickupTicket, pickupView, upsertPickupTicket, type PickupBoard, type PickupEvent } from '@/domain/pickup';
import { applyEvent, moveSeq, upsertTicket } from '@/domain/tickets';
import { isTicketEvent, type AnyLiveEvent, type BoardSnapshot, type MenuView, type TicketView } from '@/domain/types';
import type { Api } from '@/lib/api';
import { useApi } from '@/lib/api-context';
import { connectLive, liveUrl, type LinkState } from '@/lib/live-socket';
import { syncServerClock } from '@/lib/server-clock';
import { dialInKeys } from '@/queries/dial-in';
import { menuKeys } from '@/queries/menu';
import { boardKeys } from '@/queries/board';

/** Who a screen's socket is for: staff get full events; the Pickup screen faces customers. */
export type Audience = 'staff' | 'pickup';

// Boards keep ready tickets for a while (recall tray, Pickup's "ready"); each screen hides them
// itself once its own time is up. Past this they are dropped so a day's tickets don't pile up.
const KEEP_READY_MS = 30 * 60_000;
const keepOnBoard = (t: Pick<TicketView, 'status' | 'readyAt'>, nowMs: number) =>
  t.status === 'open' || (t.status === 'ready' && t.readyAt !== null && nowMs - Date.parse(t.readyAt) < KEEP_READY_MS);

function update<B>(qc: QueryClient, key: readonly string[], fn: (board: B) => B) {
  const current = qc.getQueryData<B>(key);
  if (current) qc.setQueryData<B>(key, fn(current));
}
const updateBar = (qc: QueryClient, fn: (b: BoardSnapshot) => BoardSnapshot) => update(qc, boardKeys.bar, fn);
const updatePickup = (qc: QueryClient, fn: (b: PickupBoard) => PickupBoard) => update(qc, boardKeys.pickup, fn);

/**
 * The café's settings (the jug rules, wait target, pickup timeout) ride on the board
 * snapshot. After a settings change only the location is taken from a fresh snapshot: the
 * tickets stay as the socket keeps them, so no event that lands meanwhile is lost.
 */
async function refreshLocation<B extends { location: unknown }>(qc: QueryClient, key: readonly string[], load: () => Promise<B>) {
  if (!qc.getQueryData(key)) return;
  const fresh = await load().catch(() => null);
  if (fresh) qc.setQueryData<B>(key, (b) => b && { ...b, location: fresh.location });
}

/** One Pickup-shaped event onto the Pickup board (both sockets come through here). */
function applyPickupLiveEvent(qc: QueryClient, event: PickupEvent, api?: Api) {
  updatePickup(qc, (b) => ('ticket' in event ? applyPickupEvent(b, event, keepOnBoard) : moveSeq(b, event.seq)));
  if (event.type === 'menu.changed' && api) void refreshLocation(qc, boardKeys.pickup, api.pickup);
}

export function applyLiveEvent(qc: QueryClient, event: AnyLiveEvent, api?: Api) {
  applyPickupLiveEvent(qc, pickupEvent(event), api);
  updateBar(qc, (b) => (isTicketEvent(event) ? applyEvent(b, event, keepOnBoard) : moveSeq(b, event.seq)));
  if (event.type === 'menu.changed') {
    qc.invalidateQueries({ queryKey: menuKeys.all });
    if (api) void refreshLocation(qc, boardKeys.bar, () => api.tickets({ view: 'board' }));
  } else if (event.type === 'beans.changed') {
    qc.invalidateQueries({ queryKey: dialInKeys.all });
  } else if (event.type === 'shift.changed') {
    qc.invalidateQueries({ queryKey: ['pulse'] });
  } else if (event.type === 'menu.availability') {
    // 86 / back on: the menu tile changes at once
    const { id, available } = event.item;
    qc.setQueryData<MenuView>(menuKeys.all, (menu) => menu && { ...menu, items: menu.items.map((i) => (i.id === id ? { ...i, available } : i)) });
  }
}

/** A command's answer shows at once; the event that follows changes nothing further. */
export function applyTicket(qc: QueryClient, ticket: TicketView) {
  const now = Date.now();
  updateBar(qc, (b) => upsertTicket(b, ticket, keepOnBoard, now));
  updatePickup(qc, (b) => upsertPickupTicket(b, pickupTicket(ticket), keepOnBoard, now));
}

const onBoard = <T extends Pick<TicketView, 'status' | 'readyAt'>>(tickets: T[], now: string) => tickets.filter((t) => keepOnBoard(t, Date.parse(now)));

function staffSocket(qc: QueryClient, api: Api) {
  return {
    // the board furthest behind: a board the Pickup screen's socket left alone may be
    lastSeq: () => Math.min(...[boardKeys.bar, boardKeys.pickup].map((k) => qc.getQueryData<{ seq: number }>(k)?.seq ?? Infinity)),
    onEvent: (event: AnyLiveEvent) => {
      syncServerClock(event.at);
      applyLiveEvent(qc, event, api);
    },
    onSnapshot: (snapshot: BoardSnapshot) => {
      syncServerClock(snapshot.now);
      qc.invalidateQueries({ queryKey: menuKeys.all }); // a snapshot carries no menu changes
      updateBar(qc, () => ({ ...snapshot, tickets: onBoard(snapshot.tickets, snapshot.now) }));
      const pickup = pickupView(snapshot);
      updatePickup(qc, () => ({ ...pickup, tickets: onBoard(pickup.tickets, snapshot.now) }));
    },
  };
}

function pickupSocket(qc: QueryClient, api: Api) {
  return {
    lastSeq: () => qc.getQueryData<PickupBoard>(boardKeys.pickup)?.seq ?? Infinity,
    onEvent: (event: PickupEvent) => {
      syncServerClock(event.at);
      applyPickupLiveEvent(qc, event, api);
      // this socket carries no menu details: a menu another screen cached is reloaded when used
      if (event.type.startsWith('menu.')) qc.invalidateQueries({ queryKey: menuKeys.all });
    },
    onSnapshot: (snapshot: PickupBoard) => {
      syncServerClock(snapshot.now);
      updatePickup(qc, () => ({ ...snapshot, tickets: onBoard(snapshot.tickets, snapshot.now) }));
    },
  };
}

export function useLiveBoard(audience: Audience = 'staff'): LinkState {
  const qc = useQueryClient();
  const api = useApi();
  const [state, setState] = useState<LinkState>('connecting');
  useEffect(() => {
    const url = liveUrl(window.location);
    const since = (seq: number) => (Number.isFinite(seq) ? seq : 0);
    if (audience === 'pickup') {
      const h = pickupSocket(qc, api);
      return connectLive(url, { ...h, lastSeq: () => since(h.lastSeq()), screen: 'pickup', onState: setState });
    }
    const h = staffSocket(qc, api);
    return connectLive(url, { ...h, lastSeq: () => since(h.lastSeq()), onState: setState });
  }, [qc, api, audience]);
  return state;
}
