// The session store: connect-session-knex over the app's SQLite file, made safe for
// express-session. connect-session-knex answers both through callbacks and promises, and its
// promises reject on a database error (its `touch` even skips the callback then), while
// express-session listens only to the callbacks: one SQLITE_BUSY became an unhandled rejection
// and Node ended the process. Here every call answers through its callback, once, and no
// promise is left unheard.
import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { SessionData, Store } from 'express-session';
import type { Knex } from 'knex';
import type { Logger } from 'pino';

/** A session row's `expired` is moved on at most this often per session (see touch below). */
const TOUCH_GAP_MS = 60_000;

type Callback = (err?: unknown, value?: unknown) => void;

/**
 * Tells `callback` how `work` ended, on the next tick: outside the promise chain, so an error
 * thrown by the callback stays an exception instead of becoming a rejection nobody hears.
 */
function answer(work: Promise<unknown>, callback?: Callback): void {
  work.then(
    (value) => process.nextTick(() => callback?.(null, value)),
    (err: unknown) => process.nextTick(() => callback?.(err)),
  );
}

export function createSessionStore(db: Knex, opts: { cleanupIntervalMs?: number; logger?: Logger } = {}): Store {
  const log = opts.logger;
  const store = new ConnectSessionKnexStore({
    knex: db,
    tableName: 'sessions',
    createTable: false,
    cleanupInterval: opts.cleanupIntervalMs ?? 15 * 60 * 1000,
    // its default is console.error; a cleanup that found the database busy runs again next round
    onDbCleanupError: (err: unknown) => log?.warn({ err }, 'session cleanup failed; it runs again next round'),
  });
  // a failed start shows again in every call below, each answered; this one promise is heard here
  store.ready.catch((err: unknown) => log?.error({ err }, 'session store could not start'));

  const lib = {
    get: store.get.bind(store),
    set: store.set.bind(store),
    destroy: store.destroy.bind(store),
    touch: store.touch.bind(store),
    length: store.length.bind(store),
    clear: store.clear.bind(store),
    all: store.all.bind(store),
  };
  const unheard = () => {}; // the library's own callback; its promise is what answers
  const touchedAt = new Map<string, number>();
  Object.assign(store, {
    get: (sid: string, cb?: Callback) => answer(lib.get(sid, unheard), cb),
    set: (sid: string, sess: SessionData, cb?: Callback) => answer(lib.set(sid, sess), cb),
    destroy: (sid: string, cb?: Callback) => answer(lib.destroy(sid), cb),
    length: (cb?: Callback) => answer(lib.length(unheard), cb),
    clear: (cb?: Callback) => answer(lib.clear(), cb),
    all: (cb?: Callback) => answer(lib.all(unheard), cb),
    // express-session touches the stored row as every request ends; each write waits for a disk
    // sync (synchronous=FULL) and holds the one writer. The row's `expired` only serves the cleanup
    // (the timeouts live in the session itself), so once a minute per session is enough, and a
    // failed touch loses nothing worth refusing the request for: by then its status has been sent.
    touch: (sid: string, sess: SessionData, cb?: Callback) => {
      const now = Date.now();
      if (now - (touchedAt.get(sid) ?? 0) < TOUCH_GAP_MS) return cb?.();
      if (touchedAt.size > 10_000) touchedAt.clear();
      touchedAt.set(sid, now);
      const touched = lib.touch(sid, sess).catch((err: unknown) => {
        touchedAt.delete(sid); // tried again on the session's next request
        log?.warn({ err }, 'session touch failed; tried again on its next request');
      });
      answer(touched, cb);
    },
  });
  return store;
}
