// The live socket at /ws on the app's own HTTP server. Authenticated from the session cookie at
// the upgrade; every message checked by zod; a screen resumes from the last `seq` it saw.
import type { IncomingMessage, Server } from 'node:http';
import type { Duplex } from 'node:stream';
import type { RequestHandler } from 'express';
import { WebSocket, WebSocketServer } from 'ws';
import { can } from '@/domain/roles';
import { clientMessage } from '@/domain/schemas';
import { SCREENS, type ScreenId } from '@/domain/screens';
import type { AnyLiveEvent, ServerMessage, SessionUser } from '@/domain/types';
import { endSession, findActiveUser, policyOf, recordActivity, storedSessionExpiry } from '@server/auth/session';
import { inView } from '@server/auth/cafe-in-view';
import { BUSY_RETRY_AFTER_SECONDS, isDatabaseBusy } from '@server/errors';
import type { Deps } from '@server/deps';
import { latestSeq } from '@server/events';
import { eventFrame, type Audience } from './frames';
import { createResumeSource } from './resume-source';
import { fullBucket, hasToken, isFull, takeToken, type BucketSize, type TokenBucket } from './token-bucket';

/** A screen further behind than this gets a fresh snapshot instead of a replay. */
export const MAX_REPLAY = 500;
export const HEARTBEAT_MS = 30_000;
/** After Redis is back, how long before the sessions are checked the second time. */
const RESYNC_SECOND_LOOK_MS = 2_000;
const MAX_MESSAGE_BYTES = 4096;
/** Per-socket token bucket: a screen pings every few seconds; a flood is cut off. */
export const RATE_PER_SECOND = 20;
export const RATE_BURST = 40;
const MESSAGES: BucketSize = { burst: RATE_BURST, perSecond: RATE_PER_SECOND };
/**
 * Resumes have buckets of their own: a screen resumes once per connection, yet each resume may
 * cost a read of the log or a board snapshot. A socket resumes one at a time, RESUME_BURST at
 * most and then one every RESUME_REFILL_MS; a resume beyond that is refused with `rate_limited`,
 * and RESUME_STRIKES refusals in a row close the socket (1008).
 */
export const RESUME_BURST = 3;
export const RESUME_REFILL_MS = 10_000;
export const RESUME_STRIKES = 5;
const SOCKET_RESUMES: BucketSize = { burst: RESUME_BURST, perSecond: 1000 / RESUME_REFILL_MS };
/**
 * A sign-in's sockets share a bucket too, so a screen that reconnects over and over gets no fresh
 * tokens from each new socket: SESSION_RESUME_BURST (every tab of a browser reconnecting after a
 * restart, twice over), then one a second. While it is empty a new socket of that sign-in is
 * refused at the upgrade (429), and a resume on an open one closes it with 1013 (try again
 * later): either way the screen retries after its backoff and resumes then.
 */
export const SESSION_RESUME_BURST = 16;
const SESSION_RESUMES: BucketSize = { burst: SESSION_RESUME_BURST, perSecond: 1 };
/**
 * Live sockets one sign-in (session) may hold: a browser's tabs share one. A new socket beyond
 * this closes the oldest rather than being refused: a wall screen that lost its network
 * reconnects while its old socket still looks open here (until the heartbeat drops it, up to a
 * minute), and it must get back in at once. The closed socket's screen waits before it tries
 * again (src/lib/live-socket.ts), so tabs beyond the limit don't take turns evicting each other.
 */
export const MAX_SOCKETS_PER_SESSION = 8;
/** Close code for the oldest socket of a sign-in that opened one too many. */
export const TOO_MANY_SOCKETS = 4429;
/**
 * Screens a role opens as a wall display. Their heartbeat keeps the session alive, so a Pickup
 * board or a Bar nobody touches for hours stays signed in (until the absolute limit); any other
 * screen's socket does not, so a Counter left alone signs out after the idle timeout.
 */
export const WALL_SCREENS: readonly ScreenId[] = ['bar', 'pickup'];
/** The close code for a session that has ended (signed out or timed out): the screen goes to sign-in. */
export const SESSION_ENDED = 4401;
/** Close code for a session another person took over on the same terminal. */
export const SWITCHED = 4409;
/** Close code for a session whose owner chose another café of the group: the whole page belongs
 * to the café it came from (menu, board, sequence numbers), so the screen loads again. */
export const CAFE_CHOSEN = 4412;

interface Peer {
  socket: WebSocket;
  user: SessionUser;
  sessionId: string;
  /** Events are sent only once the screen has said where it is (`resume`). */
  live: boolean;
  resuming: boolean;
  /** The shape it is sent: `pickup` once it said it is the Pickup screen, and from then on. */
  audience: Audience;
  /** Token bucket for resumes (see RESUME_BURST), and the resumes refused in a row. */
  resumes: TokenBucket;
  resumeStrikes: number;
  pending: AnyLiveEvent[];
  lastSent: number;
  alive: boolean;
  /** Token bucket for incoming messages. */
  messages: TokenBucket;
  /** Messages dropped since the bucket ran dry; the first gets a `rate_limited` error. */
  dropped: number;
  /** A wall screen (see WALL_SCREENS) whose role may open it: its pings count as activity. */
  wall: boolean;
  /** The last check found no session row (see checkSession). */
  gone: boolean;
}

export interface SocketServer {
  close(code?: number, reason?: string): Promise<void>;
  peers(): number;
  /** Closes the sockets whose session has timed out or gone (the heartbeat runs it too). */
  sweep(): Promise<void>;
}

function sendText(peer: Peer, text: string) {
  if (peer.socket.readyState === WebSocket.OPEN) peer.socket.send(text);
}

function send(peer: Peer, message: ServerMessage) {
  sendText(peer, JSON.stringify(message));
}

/** Each event is serialised once per audience for all the café's screens (frames.ts). */
function sendEvent(peer: Peer, event: AnyLiveEvent) {
  if (event.seq <= peer.lastSent) return;
  peer.lastSent = event.seq;
  sendText(peer, eventFrame(event, peer.audience));
}

export function attachSocketServer(server: Server, deps: Deps, sessionMiddleware: RequestHandler): SocketServer {
  const wss = new WebSocketServer({ noServer: true, maxPayload: MAX_MESSAGE_BYTES });
  const policy = policyOf(sessionMiddleware);
  const peers = new Set<Peer>();
  const resumes = createResumeSource(deps, MAX_REPLAY);
  /** Each sign-in's resume bucket (SESSION_RESUME_BURST), forgotten once full again. */
  const sessionResumes = new Map<string, TokenBucket>();
  const now = () => deps.clock().getTime();

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
    await new Promise<void>((resolve, reject) => sessionMiddleware(req as never, {} as never, (err?: unknown) => (err ? reject(err) : resolve())));
    const s = (req as unknown as { session?: { passport?: { user?: number }; cafeId?: number } }).session;
    const id = s?.passport?.user;
    const user = typeof id === 'number' ? await findActiveUser(deps.db, id) : null;
    return user && inView(deps.db, user, s?.cafeId);
  }

  function refuse(socket: Duplex, status: number, text: string, headers = '') {
    socket.end(`HTTP/1.1 ${status} ${text}\r\n${headers}Connection: close\r\nContent-Length: 0\r\n\r\n`);
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
        const shared = sessionResumes.get(sessionId);
        if (shared && !hasToken(shared, SESSION_RESUMES, now())) return refuse(socket, 429, 'Too Many Requests');
        wss.handleUpgrade(req, socket, head, (ws) => onConnection(ws, user, sessionId));
      },
      (err) =>
        isDatabaseBusy(err)
          ? refuse(socket, 503, 'Service Unavailable', `Retry-After: ${BUSY_RETRY_AFTER_SECONDS}\r\n`)
          : refuse(socket, 500, 'Internal Server Error'),
    );
  };
  server.on('upgrade', onUpgrade);

  async function resume(peer: Peer, since: number) {
    peer.resuming = true;
    peer.pending = [];
    try {
      // shared with every screen of the café resuming at this seq (resume-source.ts)
      const answer = await resumes.answer(peer.user.locationId, since);
      if (answer.kind === 'snapshot') {
        peer.lastSent = answer.snapshot.seq;
        sendText(peer, answer.frame(peer.audience, deps.clock().toISOString()));
      } else {
        peer.lastSent = since;
        for (const e of answer.events) sendEvent(peer, e);
      }
      // events published while we read the log: sendEvent drops what the replay already sent
      for (const e of peer.pending) sendEvent(peer, e);
      peer.live = true;
    } finally {
      peer.resuming = false;
      peer.pending = [];
    }
  }

  /**
   * A resume goes ahead when none is in flight on the socket and both its bucket and its
   * sign-in's have a token; see RESUME_BURST and SESSION_RESUME_BURST for what a refusal does.
   */
  function takeResume(peer: Peer): boolean {
    if (!peer.resuming && takeToken(peer.resumes, SOCKET_RESUMES, now())) {
      peer.resumeStrikes = 0;
      let shared = sessionResumes.get(peer.sessionId);
      if (!shared) sessionResumes.set(peer.sessionId, (shared = fullBucket(SESSION_RESUMES, now())));
      if (takeToken(shared, SESSION_RESUMES, now())) return true;
      peer.socket.close(1013, 'resuming too often on this sign-in; try again later');
      return false;
    }
    peer.resumeStrikes += 1;
    send(peer, { type: 'error', code: 'rate_limited', message: 'Resuming too often; wait a moment' });
    if (peer.resumeStrikes >= RESUME_STRIKES) peer.socket.close(1008, 'resuming too often');
    return false;
  }

  /** Makes room for one more socket of this session by closing its oldest (MAX_SOCKETS_PER_SESSION). */
  function makeRoom(sessionId: string) {
    const mine = [...peers].filter((p) => p.sessionId === sessionId); // a Set keeps insertion order: oldest first
    for (const old of mine.slice(0, Math.max(0, mine.length - MAX_SOCKETS_PER_SESSION + 1))) {
      peers.delete(old); // at once, so a burst of connections counts right
      old.socket.close(TOO_MANY_SOCKETS, 'too many screens on this sign-in');
    }
  }

  function onConnection(socket: WebSocket, user: SessionUser, sessionId: string) {
    makeRoom(sessionId);
    const peer: Peer = {
      socket,
      user,
      sessionId,
      live: false,
      resuming: false,
      audience: 'staff',
      resumes: fullBucket(SOCKET_RESUMES, now()),
      resumeStrikes: 0,
      pending: [],
      lastSent: 0,
      alive: true,
      messages: fullBucket(MESSAGES, now()),
      dropped: 0,
      wall: false,
      gone: false,
    };
    peers.add(peer);
    const unsubscribe = deps.hub.subscribe(user.locationId, (event) => {
      if (!peers.has(peer)) return; // closed to make room, still saying goodbye
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
      if (takeToken(peer.messages, MESSAGES, now())) peer.dropped = 0;
      else {
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
      if (message.type === 'ping') {
        // a wall screen's pong waits for its activity to be written; any other screen's goes at once
        const wall = peer.wall;
        if (!wall) send(peer, { type: 'pong' });
        void checkSession(peer, wall).then((ok) => {
          if (ok && wall) send(peer, { type: 'pong' });
        });
        return;
      }
      // The Pickup screen faces customers whatever the role: its shape only ever narrows.
      if (message.screen === 'pickup') peer.audience = 'pickup';
      if (!takeResume(peer)) return;
      peer.wall = isWallScreen(message.screen, user);
      if (peer.wall) void checkSession(peer);
      resume(peer, message.since).catch(() => send(peer, { type: 'error', code: 'internal', message: 'Could not resume' }));
    });
    latestSeq(deps.db, user.locationId).then(
      (seq) => send(peer, { type: 'hello', seq }),
      () => socket.close(1011, 'database unavailable'),
    );
  }

  function closeSession(sid: string, reason: string) {
    for (const peer of peers) if (peer.sessionId === sid) peer.socket.close(SESSION_ENDED, reason);
  }

  function isWallScreen(screen: ScreenId | undefined, user: SessionUser): boolean {
    return screen !== undefined && WALL_SCREENS.includes(screen) && can(user.role, SCREENS[screen].need);
  }

  /**
   * False (and the session's sockets closed) once the session has timed out or is gone; a wall
   * screen's check also marks the session active. A database hiccup keeps the socket open: the
   * next heartbeat looks again.
   */
  async function checkSession(peer: Peer, markActive = peer.wall): Promise<boolean> {
    try {
      const expiry = await storedSessionExpiry(deps.db, peer.sessionId, policy);
      // Whoever deletes a session row says so ('signed-out', 'switched'), a moment after the delete:
      // a row missing once may be a person switching right now, so only a second miss closes.
      if (expiry === 'gone') {
        const again = peer.gone;
        peer.gone = true;
        if (again) closeSession(peer.sessionId, 'signed out');
        return !again;
      }
      peer.gone = false;
      if (expiry) {
        await endSession(deps.db, peer.sessionId);
        closeSession(peer.sessionId, 'session expired');
        return false;
      }
      if (markActive) await recordActivity(deps.db, peer.sessionId, policy.now(), policy.activityGapMs);
      return true;
    } catch {
      return true;
    }
  }

  async function sweep() {
    const bySession = new Map<string, Peer>();
    for (const peer of peers) if (!bySession.has(peer.sessionId)) bySession.set(peer.sessionId, peer);
    await Promise.all([...bySession.values()].map((peer) => checkSession(peer, false)));
  }

  // Signing out ends that session's live sockets too (4401: the screen goes to sign-in).
  const onSignedOut = (sid: string) => closeSession(sid, 'signed out');
  deps.sessions.on('signed-out', onSignedOut);
  // Another person took over this terminal (PIN switch, or a welcome link opened here): the old
  // session's sockets close with a code the screen treats as a dropped line, so it reconnects on
  // the new session instead of going to sign-in.
  const onSwitched = (sid: string) => {
    for (const peer of peers) if (peer.sessionId === sid) peer.socket.close(SWITCHED, 'switched person');
  };
  deps.sessions.on('switched', onSwitched);
  const onCafeChosen = (sid: string) => {
    for (const peer of peers) if (peer.sessionId === sid) peer.socket.close(CAFE_CHOSEN, 'café chosen');
  };
  deps.sessions.on('cafe-chosen', onCafeChosen);
  // News of sign-outs may have been missed (Redis was away, redis-hub.ts): every session is checked
  // against the table now, and once more a moment later, since a session must be missing twice to
  // close (a person switching deletes the row a moment before saying so).
  const onResync = () => {
    void sweep()
      .then(() => new Promise((resolve) => setTimeout(resolve, RESYNC_SECOND_LOOK_MS).unref()))
      .then(sweep)
      .catch(() => {});
  };
  deps.sessions.on('resync', onResync);

  // Sockets that miss a heartbeat are dropped; their screen reconnects and resumes. Sockets of a
  // session that has timed out are closed.
  const heartbeat = setInterval(() => {
    sweep().catch(() => {});
    resumes.prune();
    for (const [sid, bucket] of sessionResumes) if (isFull(bucket, SESSION_RESUMES, now())) sessionResumes.delete(sid);
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
    sweep,
    close(code = 1001, reason = 'server going away') {
      clearInterval(heartbeat);
      server.off('upgrade', onUpgrade);
      deps.sessions.off('signed-out', onSignedOut);
      deps.sessions.off('switched', onSwitched);
      deps.sessions.off('cafe-chosen', onCafeChosen);
      deps.sessions.off('resync', onResync);
      for (const peer of peers) peer.socket.close(code, reason);
      return new Promise((resolve) => wss.close(() => resolve()));
    },
  };
}
