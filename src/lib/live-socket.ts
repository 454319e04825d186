// The screen's end of the live socket: connects, says where it is (resume from the last seq),
// hands events on, answers heartbeats, and reconnects with backoff when the line drops.
import type { AnyLiveEvent, BoardSnapshot, ServerMessage } from '../domain/types';

export type LinkState = 'connecting' | 'live' | 'offline';

export interface LiveSocketHandlers {
  lastSeq(): number;
  onEvent(event: AnyLiveEvent): void;
  onSnapshot(snapshot: BoardSnapshot): void;
  onState(state: LinkState): void;
}

const PING_EVERY_MS = 15_000;
const PONG_WITHIN_MS = 10_000;
const MAX_BACKOFF_MS = 10_000;
/** The server's close code when the socket's session signs out. */
const SIGNED_OUT = 4401;

const connectedListeners = new Set<() => void>();
/** Told each time a live socket (re)connects: the server is back, so anything waiting can go. */
export function onLiveConnected(listener: () => void): () => void {
  connectedListeners.add(listener);
  return () => void connectedListeners.delete(listener);
}

export function connectLive(url: string, h: LiveSocketHandlers): () => void {
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
    ws.onopen = () => {
      attempts = 0;
      ws.send(JSON.stringify({ type: 'resume', since: h.lastSeq() }));
      pingTimer = setInterval(() => {
        ws.send(JSON.stringify({ type: 'ping' }));
        pongTimer = setTimeout(() => ws.close(), PONG_WITHIN_MS);
      }, PING_EVERY_MS);
    };
    ws.onmessage = (msg) => {
      const m = JSON.parse(String(msg.data)) as ServerMessage;
      if (m.type === 'hello') {
        h.onState('live');
        for (const listener of connectedListeners) listener();
      } else if (m.type === 'pong') clearTimeout(pongTimer);
      else if (m.type === 'event') h.onEvent(m.event);
      else if (m.type === 'snapshot') h.onSnapshot(m.snapshot);
    };
    ws.onclose = (event) => {
      clearTimers();
      if (stopped) return;
      if (event.code === SIGNED_OUT) {
        // this session was signed out (here or on another tab): back to sign-in, no retry
        if (!window.location.pathname.startsWith('/signin')) {
          window.location.assign(`/signin?next=${encodeURIComponent(window.location.pathname)}`);
        }
        return;
      }
      h.onState('offline');
      // 0.5 s, 1 s, 2 s … up to 10 s, with jitter so a room of screens doesn't reconnect at once
      const delay = Math.min(MAX_BACKOFF_MS, 500 * 2 ** attempts++) * (0.75 + Math.random() / 2);
      retryTimer = setTimeout(open, delay);
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
