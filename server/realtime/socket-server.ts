// The live socket at /ws on the app's own HTTP server. Authenticated from the session cookie at
// the upgrade; every message checked by zod; a screen resumes from the last `seq` it saw.
import type { IncomingMessage, Server } from 'node:http';
import type { Duplex } from 'node:stream';
import type { RequestHandler } from 'express';
import { WebSocket, WebSocketServer } from 'ws';
import { clientMessage } from '../../src/domain/schemas';
import type { AnyLiveEvent, ServerMessage, SessionUser } from '../../src/domain/types';
import { findActiveUser } from '../auth/session';
import type { Deps } from '../services/deps';
import { eventsSince, latestSeq } from '../services/events';
import { boardSnapshot } from '../services/tickets';

/** A screen further behind than this gets a fresh snapshot instead of a replay. */
export const MAX_REPLAY = 500;
export const HEARTBEAT_MS = 30_000;
const MAX_MESSAGE_BYTES = 4096;
/** Per-socket token bucket: a screen pings every few seconds; a flood is cut off. */
export const RATE_PER_SECOND = 20;
export const RATE_BURST = 40;

interface Peer {
  socket: WebSocket;
  user: SessionUser;
  sessionId: string;
  /** Events are sent only once the screen has said where it is (`resume`). */
  live: boolean;
  resuming: boolean;
  pending: AnyLiveEvent[];
  lastSent: number;
  alive: boolean;
  /** Token bucket for incoming messages. */
  tokens: number;
  refilledAt: number;
  /** Messages dropped since the bucket ran dry; the first gets a `rate_limited` error. */
  dropped: number;
}

export interface SocketServer {
  close(code?: number, reason?: string): Promise<void>;
  peers(): number;
}

function send(peer: Peer, message: ServerMessage) {
  if (peer.socket.readyState === WebSocket.OPEN) peer.socket.send(JSON.stringify(message));
}

function sendEvent(peer: Peer, event: AnyLiveEvent) {
  if (event.seq <= peer.lastSent) return;
  peer.lastSent = event.seq;
  send(peer, { type: 'event', event });
}

export function attachSocketServer(
  server: Server,
  deps: Deps,
  sessionMiddleware: RequestHandler,
): SocketServer {
  const wss = new WebSocketServer({ noServer: true, maxPayload: MAX_MESSAGE_BYTES });
  const peers = new Set<Peer>();

  /** A browser says where the page came from; only our own pages may open the live socket. */
  function sameOrigin(req: IncomingMessage): boolean {
    const origin = req.headers.origin;
    if (!origin) return true; // not a browser (screens always send one)
    try {
      return new URL(origin).host === req.headers.host;
    } catch {
      return false;
    }
  }

  async function authenticate(req: IncomingMessage): Promise<SessionUser | null> {
    await new Promise<void>((resolve, reject) =>
      sessionMiddleware(req as never, {} as never, (err?: unknown) => (err ? reject(err) : resolve())),
    );
    const id = (req as unknown as { session?: { passport?: { user?: number } } }).session?.passport?.user;
    return typeof id === 'number' ? findActiveUser(deps.db, id) : null;
  }

  function refuse(socket: Duplex, status: number, text: string) {
    socket.end(`HTTP/1.1 ${status} ${text}\r\nConnection: close\r\nContent-Length: 0\r\n\r\n`);
  }

  const onUpgrade = (req: IncomingMessage, socket: Duplex, head: Buffer) => {
    const path = (req.url ?? '').split('?')[0];
    if (path !== '/ws') return; // leave other upgrades (Vite's HMR socket in dev) alone
    // Node drops its own socket error handler on upgrade and ws adds one only in handleUpgrade:
    // without this, a client resetting the connection while we authenticate crashes the process.
    const onEarlyError = () => socket.destroy();
    socket.on('error', onEarlyError);
    if (!sameOrigin(req)) return refuse(socket, 403, 'Forbidden');
    authenticate(req).then(
      (user) => {
        if (!user) return refuse(socket, 401, 'Unauthorized');
        socket.off('error', onEarlyError);
        const sessionId = (req as unknown as { sessionID: string }).sessionID;
        wss.handleUpgrade(req, socket, head, (ws) => onConnection(ws, user, sessionId));
      },
      () => refuse(socket, 500, 'Internal Server Error'),
    );
  };
  server.on('upgrade', onUpgrade);

  async function resume(peer: Peer, since: number) {
    peer.resuming = true;
    peer.pending = [];
    try {
      const missed = await eventsSince(deps.db, peer.user.locationId, since, MAX_REPLAY);
      if (missed.length > MAX_REPLAY) {
        const snapshot = await boardSnapshot(deps, peer.user.locationId);
        peer.lastSent = snapshot.seq;
        send(peer, { type: 'snapshot', snapshot });
      } else {
        peer.lastSent = since;
        for (const e of missed) sendEvent(peer, e);
      }
      // events published while we read the log: sendEvent drops what the replay already sent
      for (const e of peer.pending) sendEvent(peer, e);
      peer.live = true;
    } finally {
      peer.resuming = false;
      peer.pending = [];
    }
  }

  /** Takes a token for one message; false once the screen sends faster than the bucket refills. */
  function takeToken(peer: Peer): boolean {
    const now = deps.clock().getTime();
    const elapsed = Math.max(0, now - peer.refilledAt);
    peer.tokens = Math.min(RATE_BURST, peer.tokens + (elapsed * RATE_PER_SECOND) / 1000);
    peer.refilledAt = Math.max(peer.refilledAt, now);
    if (peer.tokens >= 1) {
      peer.tokens -= 1;
      peer.dropped = 0;
      return true;
    }
    return false;
  }

  function onConnection(socket: WebSocket, user: SessionUser, sessionId: string) {
    const peer: Peer = {
      socket,
      user,
      sessionId,
      live: false,
      resuming: false,
      pending: [],
      lastSent: 0,
      alive: true,
      tokens: RATE_BURST,
      refilledAt: deps.clock().getTime(),
      dropped: 0,
    };
    peers.add(peer);
    const unsubscribe = deps.hub.subscribe(user.locationId, (event) => {
      if (peer.resuming) peer.pending.push(event);
      else if (peer.live) sendEvent(peer, event);
    });
    // ws closes the socket itself on a protocol error (an over-size message: 1009) and then emits
    // 'error'; unheard, that error would be thrown and take the whole server down.
    socket.on('error', () => {});
    socket.on('pong', () => (peer.alive = true));
    socket.on('close', () => {
      unsubscribe();
      peers.delete(peer);
    });
    socket.on('message', (data) => {
      if (!takeToken(peer)) {
        peer.dropped += 1;
        if (peer.dropped === 1) send(peer, { type: 'error', code: 'rate_limited', message: 'Too many messages; slow down' });
        // still flooding after the warning: 1008 (policy violation); the screen reconnects and resumes
        if (peer.dropped >= RATE_BURST) socket.close(1008, 'rate limited');
        return;
      }
      let parsed: unknown;
      try {
        parsed = JSON.parse(data.toString());
      } catch {
        return send(peer, { type: 'error', code: 'validation_failed', message: 'Messages are JSON' });
      }
      const result = clientMessage.safeParse(parsed);
      if (!result.success) {
        return send(peer, { type: 'error', code: 'validation_failed', message: result.error.issues[0]?.message ?? 'Bad message' });
      }
      const message = result.data;
      if (message.type === 'ping') return send(peer, { type: 'pong' });
      resume(peer, message.since).catch(() => send(peer, { type: 'error', code: 'internal', message: 'Could not resume' }));
    });
    latestSeq(deps.db, user.locationId).then(
      (seq) => send(peer, { type: 'hello', seq }),
      () => socket.close(1011, 'database unavailable'),
    );
  }

  // Signing out ends that session's live sockets too (4401: the screen goes to sign-in).
  const onSignedOut = (sid: string) => {
    for (const peer of peers) if (peer.sessionId === sid) peer.socket.close(4401, 'signed out');
  };
  deps.sessions.on('signed-out', onSignedOut);

  // Sockets that miss a heartbeat are dropped; their screen reconnects and resumes.
  const heartbeat = setInterval(() => {
    for (const peer of peers) {
      if (!peer.alive) {
        peer.socket.terminate();
        continue;
      }
      peer.alive = false;
      peer.socket.ping();
    }
  }, HEARTBEAT_MS);
  heartbeat.unref();

  return {
    peers: () => peers.size,
    close(code = 1001, reason = 'server going away') {
      clearInterval(heartbeat);
      server.off('upgrade', onUpgrade);
      deps.sessions.off('signed-out', onSignedOut);
      for (const peer of peers) peer.socket.close(code, reason);
      return new Promise((resolve) => wss.close(() => resolve()));
    },
  };
}
