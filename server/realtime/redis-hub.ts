// The hub across processes (REDIS_URL): a process publishes each committed event on a Redis
// channel, and every process hands the events of each café to its own sockets in sequence order,
// without a gap or a repeat. Redis pub/sub delivers at most once (a publish made while a process
// was disconnected is never seen again), so the events table stays the truth: each process keeps,
// per café, the last sequence it delivered, and fills any gap from the table before going on.
import { randomUUID } from 'node:crypto';
import { EventEmitter } from 'node:events';
import { Redis } from 'ioredis';
import type { Knex } from 'knex';
import type { AnyLiveEvent } from '@/domain/types';
import { eventsSince, latestSeq } from '@server/events';
import type { EventListener, Hub } from './hub';

export const EVENTS_CHANNEL = 'jugline:events';
/** Sign-outs, person switches and an owner's choice of café ('signed-out', 'switched', 'cafe-chosen' with the session id). */
export const SESSIONS_CHANNEL = 'jugline:sessions';
const SESSION_NEWS = ['signed-out', 'switched', 'cafe-chosen'] as const;
/** Events read from the table per fill; a café far behind takes several reads. */
const FILL_BATCH = 500;

interface Cafe {
  listeners: Set<EventListener>;
  /** The last sequence handed to the listeners; null until read from the table. */
  delivered: number | null;
  /** Events that arrived ahead of a gap, by sequence. */
  ahead: Map<number, AnyLiveEvent>;
  /** A fill from the table in progress (one at a time per café). */
  filling: Promise<void> | null;
}

export interface RedisHub extends Hub {
  /** Resolves once subscribed to the channels. */
  ready: Promise<void>;
  /**
   * Deps.sessions across processes: the SESSION_NEWS emitted here reach this process's
   * listeners at once and every other process's through Redis, so a sign-out on one process closes
   * that session's screens on all of them.
   */
  sessions: EventEmitter;
  close(): Promise<void>;
}

export function createRedisHub(url: string, db: Knex, log: (message: string) => void = console.warn): RedisHub {
  // One connection publishes; a connection that subscribes can do nothing else. A publish made
  // while Redis is away fails at once instead of waiting in a queue: the table has the event, and
  // the other processes fill it in when they are back.
  const publisher = new Redis(url, { enableOfflineQueue: false, maxRetriesPerRequest: 1 });
  const subscriber = new Redis(url, { maxRetriesPerRequest: null });
  const cafes = new Map<number, Cafe>();
  let closed = false;

  const cafeOf = (locationId: number): Cafe => {
    const known = cafes.get(locationId);
    if (known) return known;
    const cafe: Cafe = { listeners: new Set(), delivered: null, ahead: new Map(), filling: null };
    cafes.set(locationId, cafe);
    return cafe;
  };

  function hand(cafe: Cafe, event: AnyLiveEvent) {
    cafe.delivered = event.seq;
    for (const listener of cafe.listeners) listener(event);
  }

  /** Hands over the events next in line; forgets those already handed over. */
  function handNext(cafe: Cafe) {
    if (cafe.delivered === null) return;
    for (let next = cafe.ahead.get(cafe.delivered + 1); next; next = cafe.ahead.get(cafe.delivered + 1)) {
      cafe.ahead.delete(next.seq);
      hand(cafe, next);
    }
    for (const seq of cafe.ahead.keys()) if (seq <= cafe.delivered) cafe.ahead.delete(seq);
  }

  /** What is next in line goes out; a gap before the rest is filled from the table first. */
  function drain(locationId: number, cafe: Cafe) {
    if (cafe.filling) return; // the fill drains when it is done
    handNext(cafe);
    if (cafe.delivered === null || cafe.ahead.size > 0) void fill(locationId, cafe);
  }

  /** Reads from the table what followed the last delivered sequence, and hands it over in order. */
  function fill(locationId: number, cafe: Cafe): Promise<void> {
    if (cafe.filling) return cafe.filling;
    cafe.filling = (async () => {
      const before = cafe.delivered;
      try {
        // first use in this process: its screens resume from the table; go on from its end
        if (cafe.delivered === null) cafe.delivered = await latestSeq(db, locationId);
        for (;;) {
          const batch = await eventsSince(db, locationId, cafe.delivered, FILL_BATCH);
          for (const event of batch.slice(0, FILL_BATCH)) if (event.seq === cafe.delivered + 1) hand(cafe, event);
          if (batch.length <= FILL_BATCH) break;
        }
      } catch (err) {
        log(`Live events for café ${locationId} could not be read from the database: ${(err as Error).message}`);
      } finally {
        cafe.filling = null;
      }
      if (closed) return;
      handNext(cafe);
      if (cafe.ahead.size === 0) return;
      if (cafe.delivered !== before) return drain(locationId, cafe);
      // The table had nothing after the gap (it could not be read): hand the rest over in order
      // rather than hold the café's screens back; each screen resumes from its last seq if it must.
      for (const seq of [...cafe.ahead.keys()].sort((a, b) => a - b)) hand(cafe, cafe.ahead.get(seq)!);
      cafe.ahead.clear();
    })();
    return cafe.filling;
  }

  /** An event of this process or another: in order, once. */
  function accept(locationId: number, event: AnyLiveEvent) {
    const cafe = cafes.get(locationId);
    if (!cafe || cafe.listeners.size === 0) return; // nobody here watches that café
    if (cafe.delivered !== null && event.seq <= cafe.delivered) return; // seen already
    cafe.ahead.set(event.seq, event);
    drain(locationId, cafe);
  }

  // A sign-out has no table to be filled from: while Redis is away it waits (a bounded few) and
  // goes out when the connection is back. One lost anyway is caught by the other processes'
  // heartbeat, which finds the session gone within a minute (socket-server.ts).
  const newsWaiting: string[] = [];
  const sendNews = (text: string) =>
    publisher.publish(SESSIONS_CHANNEL, text).catch((err: Error) => log(`A sign-out could not be published to Redis: ${err.message}`));
  const publishNews = (text: string) => {
    if (publisher.status === 'ready') void sendNews(text);
    else if (newsWaiting.length < 1000) newsWaiting.push(text);
  };
  publisher.on('ready', () => {
    for (const text of newsWaiting.splice(0)) void sendNews(text);
  });

  // this process's own news comes back from Redis too: it is told apart by this tag
  const origin = randomUUID();
  const sessions = new EventEmitter();
  const emitHere = sessions.emit.bind(sessions);
  sessions.emit = (name: string | symbol, ...args: unknown[]) => {
    const handled = emitHere(name, ...args);
    if ((SESSION_NEWS as readonly (string | symbol)[]).includes(name)) publishNews(JSON.stringify({ origin, name, sid: args[0] }));
    return handled;
  };

  subscriber.on('message', (channel: string, text: string) => {
    if (channel === SESSIONS_CHANNEL) {
      try {
        const news = JSON.parse(text) as { origin: string; name: string; sid: string };
        if (news.origin !== origin && (SESSION_NEWS as readonly string[]).includes(news.name)) emitHere(news.name, news.sid);
      } catch {
        log('A sign-out on Redis could not be read.');
      }
      return;
    }
    if (channel !== EVENTS_CHANNEL) return;
    try {
      const { locationId, event } = JSON.parse(text) as { locationId: number; event: AnyLiveEvent };
      accept(locationId, event);
    } catch {
      log('A live event on Redis could not be read; it is filled from the database instead.');
    }
  });
  // Back after a lost connection: ioredis subscribes again by itself, but what was published in
  // between is gone. Every café watched here reads what it missed from the table, and the screens
  // check their sessions against the table at once ('resync', socket-server.ts): a sign-out made
  // meanwhile on another process would otherwise reach them only at the next heartbeat.
  let connectedBefore = false;
  subscriber.on('ready', () => {
    if (connectedBefore) {
      for (const [locationId, cafe] of cafes) if (cafe.listeners.size > 0) void fill(locationId, cafe);
      emitHere('resync');
    }
    connectedBefore = true;
  });
  for (const connection of [publisher, subscriber]) connection.on('error', (err: Error) => log(`Redis: ${err.message}`));
  const ready = Promise.all([
    subscriber.subscribe(EVENTS_CHANNEL, SESSIONS_CHANNEL),
    new Promise<void>((resolve) => (publisher.status === 'ready' ? resolve() : publisher.once('ready', () => resolve()))),
  ]).then(() => undefined);

  return {
    ready,
    sessions,
    publish(locationId, event) {
      // this process's own screens at once; the echo from Redis is then a repeat and is dropped
      accept(locationId, event);
      publisher.publish(EVENTS_CHANNEL, JSON.stringify({ locationId, event })).catch((err: Error) => {
        // the other processes fill it from the table when their next event shows the gap
        log(`An event could not be published to Redis: ${err.message}`);
      });
    },
    subscribe(locationId, listener) {
      const cafe = cafeOf(locationId);
      cafe.listeners.add(listener);
      if (cafe.delivered === null) void fill(locationId, cafe);
      return () => cafe.listeners.delete(listener);
    },
    async close() {
      closed = true;
      await Promise.allSettled([...cafes.values()].map((c) => c.filling));
      subscriber.disconnect();
      publisher.disconnect();
    },
  };
}
