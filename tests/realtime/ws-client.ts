// A small live-socket client for the realtime tests: the real `ws` client against the real
// server, collecting every server message in arrival order.
import WebSocket from 'ws';
import type { LiveEvent, ServerMessage } from '@/domain/types';

/** Only a safety net so a broken test fails instead of hanging; never a timing assertion. */
export const SAFETY_TIMEOUT_MS = 5_000;

type Predicate = (message: ServerMessage) => boolean;

export interface LiveClient {
  socket: WebSocket;
  /** Every message the server sent, in arrival order. */
  messages: ServerMessage[];
  /** The same messages as the raw text frames that carried them. */
  frames: string[];
  /** The events received so far, in arrival order. */
  events(): LiveEvent[];
  /**
   * The next not-yet-taken message matching `predicate` (already received or still to come).
   * Messages are taken in order: a later call never returns a message before an earlier match.
   */
  next(predicate?: Predicate, what?: string): Promise<ServerMessage>;
  /** Shorthand: the next `event` message, optionally of one event type. */
  nextEvent(type?: LiveEvent['type']): Promise<LiveEvent>;
  send(message: unknown): void;
  sendRaw(data: string): void;
  close(): Promise<void>;
}

const open = new Set<WebSocket>();

export function wsUrl(httpUrl: string): string {
  return `${httpUrl.replace(/^http/, 'ws')}/ws`;
}

/** Connect with a session cookie; resolves once the socket is open. */
export function connect(httpUrl: string, cookie: string): Promise<LiveClient> {
  const socket = new WebSocket(wsUrl(httpUrl), { headers: { Cookie: cookie } });
  open.add(socket);
  const messages: ServerMessage[] = [];
  const frames: string[] = [];
  let taken = -1; // index of the last message handed out by next()
  const waiters = new Set<() => void>();

  socket.on('message', (data) => {
    frames.push(data.toString());
    messages.push(JSON.parse(data.toString()) as ServerMessage);
    for (const wake of [...waiters]) wake();
  });
  socket.on('close', () => {
    open.delete(socket);
    for (const wake of [...waiters]) wake();
  });

  const client: LiveClient = {
    socket,
    messages,
    frames,
    events: () => messages.flatMap((m) => (m.type === 'event' ? [m.event as LiveEvent] : [])),
    next(predicate = () => true, what = 'a matching message') {
      return new Promise<ServerMessage>((resolve, reject) => {
        const check = () => {
          for (let i = taken + 1; i < messages.length; i++) {
            if (predicate(messages[i])) {
              taken = i;
              done();
              resolve(messages[i]);
              return;
            }
          }
          if (socket.readyState === WebSocket.CLOSED) {
            done();
            reject(new Error(`socket closed while waiting for ${what}; got ${JSON.stringify(messages)}`));
          }
        };
        const timer = setTimeout(() => {
          done();
          reject(new Error(`no ${what} within ${SAFETY_TIMEOUT_MS} ms; got ${JSON.stringify(messages)}`));
        }, SAFETY_TIMEOUT_MS);
        const done = () => {
          clearTimeout(timer);
          waiters.delete(check);
        };
        waiters.add(check);
        check();
      });
    },
    async nextEvent(type) {
      const m = await client.next((msg) => msg.type === 'event' && (type === undefined || msg.event.type === type), type ? `a ${type} event` : 'an event');
      return (m as Extract<ServerMessage, { type: 'event' }>).event as LiveEvent;
    },
    send(message) {
      socket.send(JSON.stringify(message));
    },
    sendRaw(data) {
      socket.send(data);
    },
    close: () => closeSocket(socket),
  };

  return new Promise((resolve, reject) => {
    socket.once('open', () => resolve(client));
    socket.once('unexpected-response', (_req, res) => {
      res.resume();
      socket.terminate();
      reject(new Error(`upgrade refused with ${res.statusCode}`));
    });
    socket.on('error', (err) => reject(err));
  });
}

/** Connect and do the handshake: wait for `hello`, then resume from `since` (default hello.seq). */
export async function connectAndResume(httpUrl: string, cookie: string, since?: number) {
  const client = await connect(httpUrl, cookie);
  const hello = (await client.next((m) => m.type === 'hello', 'hello')) as Extract<ServerMessage, { type: 'hello' }>;
  client.send({ type: 'resume', since: since ?? hello.seq });
  return { client, hello };
}

export type UpgradeOutcome = { opened: true } | { opened: false; status?: number; error?: string };

/** Try an upgrade that should be refused, reporting what happened instead of throwing. */
export function tryUpgrade(httpUrl: string, headers: Record<string, string> = {}): Promise<UpgradeOutcome> {
  const socket = new WebSocket(wsUrl(httpUrl), { headers });
  open.add(socket);
  return new Promise((resolve) => {
    let settled = false;
    const settle = (outcome: UpgradeOutcome) => {
      if (settled) return;
      settled = true;
      resolve(outcome);
    };
    socket.once('open', () => {
      settle({ opened: true });
      socket.close();
    });
    socket.once('unexpected-response', (_req, res) => {
      settle({ opened: false, status: res.statusCode });
      res.resume();
      socket.terminate();
    });
    socket.on('error', (err) => settle({ opened: false, error: err.message }));
    socket.once('close', () => open.delete(socket));
  });
}

function closeSocket(socket: WebSocket): Promise<void> {
  if (socket.readyState === WebSocket.CLOSED) return Promise.resolve();
  return new Promise((resolve) => {
    socket.once('close', () => resolve());
    if (socket.readyState === WebSocket.CONNECTING) socket.terminate();
    else if (socket.readyState === WebSocket.OPEN) socket.close();
  });
}

/** Close every socket the tests opened (for afterEach/afterAll). */
export async function closeAllSockets(): Promise<void> {
  await Promise.all([...open].map(closeSocket));
  open.clear();
}
