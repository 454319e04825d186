// The screen's end of the live socket: connects, says where it is (resume from the last seq),
// hands events on, answers heartbeats, and reconnects with backoff when the line drops. A session
// that has ended (signed out, or timed out) sends the screen to sign-in.
import { SCREENS, type ScreenId } from '@/domain/screens';
import type { PickupServerMessage } from '@/domain/pickup';
import type { AnyLiveEvent, BoardSnapshot, ServerMessage } from '@/domain/types';
import { goToSignIn, isLeaving, PASSIVE_REQUEST_HEADER } from './http';

export type LinkState = 'connecting' | 'live' | 'offline';

/**
 * The screen's handlers. The events and snapshots are the full ones, or the Pickup screen's
 * (src/domain/pickup.ts) on a socket whose `screen` is `pickup`: the server shapes them by screen.
 */
export interface LiveSocketHandlers<E = AnyLiveEvent, S = BoardSnapshot> {
  lastSeq(): number;
  onEvent(event: E): void;
  onSnapshot(snapshot: S): void;
  onState(state: LinkState): void;
  /** The screen this socket serves; by default the one at the page's path. */
  screen?: ScreenId;
}

const PING_EVERY_MS = 15_000;
const PONG_WITHIN_MS = 10_000;
const MAX_BACKOFF_MS = 10_000;
/** The server's close code when the socket's session signs out or times out. */
const SIGNED_OUT = 4401;
/** The server's close code when this terminal switched person (server/realtime/socket-server.ts). */
const SWITCHED = 4409;
/** The server's close code when the owner chose another café of the group for this session. */
const CAFE_CHOSEN = 4412;
/** The server's close code for the oldest socket of a sign-in with too many (MAX_SOCKETS_PER_SESSION). */
const TOO_MANY_SOCKETS = 4429;
/** After that close: long enough that tabs beyond the limit don't take turns closing each other. */
const AFTER_TOO_MANY_MS = 30_000;
/** After a switch the page is about to load again as the new person; a socket reconnecting now
 * would reload this screen's data with a role that may not see it. */
const AFTER_SWITCH_MS = 5_000;

/** The screen at a path, if it is one of SCREENS (the server decides which keep a session alive). */
export function screenAt(pathname: string): ScreenId | undefined {
  return (Object.keys(SCREENS) as ScreenId[]).find((id) => SCREENS[id].path === pathname);
}

// kept here too for the code that reads them from the socket module
export { goToSignIn, PASSIVE_REQUEST_HEADER };

/** false when the server answers that nobody is signed in here; undefined when it can't be asked. */
async function stillSignedIn(): Promise<boolean | undefined> {
  try {
    const res = await fetch('/api/session', { credentials: 'same-origin', headers: { accept: 'application/json', [PASSIVE_REQUEST_HEADER]: '1' } });
    if (!res.ok) return undefined;
    return ((await res.json()) as { user: unknown }).user != null;
  } catch {
    return undefined;
  }
}

const connectedListeners = new Set<() => void>();
/** Told each time a live socket (re)connects: the server is back, so anything waiting can go. */
export function onLiveConnected(listener: () => void): () => void {
  connectedListeners.add(listener);
  return () => void connectedListeners.delete(listener);
}

export function connectLive<E = AnyLiveEvent, S = BoardSnapshot>(url: string, h: LiveSocketHandlers<E, S>): () => void {
  let socket: WebSocket | null = null;
  let attempts = 0;
  let stopped = false;
  let retryTimer: ReturnType<typeof setTimeout> | undefined;
  let pingTimer: ReturnType<typeof setInterval> | undefined;
  let pongTimer: ReturnType<typeof setTimeout> | undefined;

  const clearTimers = () => {
    clearInterval(pingTimer);
    clearTimeout(pongTimer);
  };

  function open() {
    h.onState('connecting');
    const ws = new WebSocket(url);
    socket = ws;
    let opened = false;
    ws.onopen = () => {
      opened = true;
      attempts = 0;
      ws.send(JSON.stringify({ type: 'resume', since: h.lastSeq(), screen: h.screen ?? screenAt(window.location.pathname) }));
      pingTimer = setInterval(() => {
        ws.send(JSON.stringify({ type: 'ping' }));
        pongTimer = setTimeout(() => ws.close(), PONG_WITHIN_MS);
      }, PING_EVERY_MS);
    };
    ws.onmessage = (msg) => {
      const m = JSON.parse(String(msg.data)) as ServerMessage | PickupServerMessage;
      if (m.type === 'hello') {
        h.onState('live');
        for (const listener of connectedListeners) listener();
      } else if (m.type === 'pong') clearTimeout(pongTimer);
      else if (m.type === 'event') h.onEvent(m.event as E);
      else if (m.type === 'snapshot') h.onSnapshot(m.snapshot as S);
    };
    ws.onclose = (event) => {
      clearTimers();
      if (stopped || isLeaving()) return;
      if (event.code === SIGNED_OUT) {
        // this session was signed out or timed out (here or on another tab): back to sign-in, no retry
        goToSignIn();
        return;
      }
      if (event.code === CAFE_CHOSEN) {
        // everything this page holds (menu, board, last seq) is the other café's: load it afresh
        window.location.reload();
        return;
      }
      h.onState('offline');
      // refused before it opened: if that is because the session has ended, retrying can't help
      if (!opened) {
        void stillSignedIn().then((signedIn) => {
          if (signedIn === false && !stopped) goToSignIn();
        });
      }
      // 0.5 s, 1 s, 2 s … up to 10 s, with jitter so a room of screens doesn't reconnect at once
      const backoff = () => Math.min(MAX_BACKOFF_MS, 500 * 2 ** attempts++) * (0.75 + Math.random() / 2);
      const delay = event.code === SWITCHED ? AFTER_SWITCH_MS : event.code === TOO_MANY_SOCKETS ? AFTER_TOO_MANY_MS : backoff();
      retryTimer = setTimeout(() => isLeaving() || open(), delay);
    };
  }

  open();
  return () => {
    stopped = true;
    clearTimers();
    clearTimeout(retryTimer);
    socket?.close();
  };
}

export function liveUrl(location: Location): string {
  return `${location.protocol === 'https:' ? 'wss' : 'ws'}://${location.host}/ws`;
}
