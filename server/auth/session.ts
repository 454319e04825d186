// Sessions in the same SQLite file (connect-session-knex), passport-local sign-in, and the two
// session timeouts (OWASP Session Management Cheat Sheet: idle 15–30 min for a low-risk app,
// absolute 4–8 h for a working day), both measured on the server.
import { randomBytes } from 'node:crypto';
import type { IncomingMessage } from 'node:http';
import type { RequestHandler } from 'express';
import session from 'express-session';
import type { Knex } from 'knex';
import { Passport } from 'passport';
import type { Logger } from 'pino';
import { Strategy as LocalStrategy } from 'passport-local';
import type { SessionUser } from '@/domain/types';
import { PASSIVE_REQUEST_HEADER } from '@/reads';
import { dialectOf, jsonNumberSql, jsonSetNumbersSql } from '@server/db/dialect';
import { bool } from '@server/db/rows';
import { conflict } from '@server/domain-errors';
import { hashPassword, verifyPassword } from './passwords';
import { inView } from './cafe-in-view';
import { createSessionStore } from './session-store';
import type { Row } from '@server/db/tables';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
  }
}

declare module 'express-session' {
  interface SessionData extends SessionTimes {
    /** The café an owner chose to work on (server/auth/cafe-in-view.ts); their own when unset. */
    cafeId?: number;
  }
}

export const SESSION_COOKIE = 'jugline.sid';
/** Absolute session length: one working day (OWASP Session Management: 4–8 h). */
export const SESSION_MAX_AGE_MS = 8 * 60 * 60 * 1000;
/** Idle timeout unless SESSION_IDLE_MINUTES says otherwise (OWASP: 15–30 min for a low-risk app). */
export const DEFAULT_IDLE_MINUTES = 30;
/**
 * Activity is written at most once a minute per session (each write waits for a disk sync and
 * holds the one writer), and never less often than a tenth of the idle limit: the idle clock may
 * run that much early, never late. A flat minute would sign out a person active every 30 s at
 * SESSION_IDLE_MINUTES=1.
 */
const MAX_ACTIVITY_GAP_MS = 60_000;
const activityGapMs = (idleMs: number) => Math.min(MAX_ACTIVITY_GAP_MS, Math.floor(idleMs / 10));

/** What a session row keeps about its own age (ms since the epoch, on the session clock). */
export interface SessionTimes {
  signedInAt?: number;
  lastActiveAt?: number;
}

/**
 * The timeouts and the clock they are measured on. The clock is the wall clock apart from the
 * café clock (Deps.clock) that tests move to age tickets and change days; in production both
 * are the real time.
 */
export interface SessionPolicy {
  idleMs: number;
  absoluteMs: number;
  /** Activity younger than this is not written again (activityGapMs). */
  activityGapMs: number;
  now(): number;
}

export type Expiry = 'idle' | 'absolute' | null;

/** Why a signed-in session is over at `now`, or null while it is good. Missing times count as fresh. */
export function expiryOf(times: SessionTimes, now: number, policy: Pick<SessionPolicy, 'idleMs' | 'absoluteMs'>): Expiry {
  if (times.signedInAt !== undefined && now - times.signedInAt >= policy.absoluteMs) return 'absolute';
  if (times.lastActiveAt !== undefined && now - times.lastActiveAt >= policy.idleMs) return 'idle';
  return null;
}

export interface SessionOptions {
  cleanupIntervalMs?: number;
  /** Idle timeout in minutes; DEFAULT_IDLE_MINUTES when left out. */
  idleMinutes?: number;
  /** The session clock; real time when left out. */
  clock?: () => Date;
  /** Told the id of a session that has just timed out, so its live screens can be closed. */
  onExpired?: (sid: string) => void;
  /** Where the session store's own failures are logged (a touch or a cleanup that found the database busy). */
  logger?: Logger;
}

/** The session middleware, carrying its policy for the live socket's own checks. */
export type SessionMiddleware = RequestHandler & { policy: SessionPolicy };

export function sessionPolicy(opts: Pick<SessionOptions, 'idleMinutes' | 'clock'> = {}): SessionPolicy {
  const clock = opts.clock ?? (() => new Date());
  const idleMs = (opts.idleMinutes ?? DEFAULT_IDLE_MINUTES) * 60_000;
  return { idleMs, absoluteMs: SESSION_MAX_AGE_MS, activityGapMs: activityGapMs(idleMs), now: () => clock().getTime() };
}

/** The policy a session middleware was made with (the defaults for any other middleware). */
export const policyOf = (middleware: RequestHandler): SessionPolicy => (middleware as Partial<SessionMiddleware>).policy ?? sessionPolicy();

export function createSessionMiddleware(db: Knex, secret: string, opts: SessionOptions = {}): SessionMiddleware {
  const store = createSessionStore(db, { cleanupIntervalMs: opts.cleanupIntervalMs, logger: opts.logger });
  const base = session({
    name: SESSION_COOKIE,
    secret,
    store,
    resave: false,
    saveUninitialized: false,
    cookie: { httpOnly: true, sameSite: 'lax', secure: 'auto', maxAge: SESSION_MAX_AGE_MS },
  });
  const policy = sessionPolicy(opts);

  const middleware: RequestHandler = (req, res, next) =>
    base(req, res, (err?: unknown) => {
      if (err) return next(err);
      enforceTimeouts(db, req, policy, opts.onExpired).then(() => next(), next);
    });
  return Object.assign(middleware, { policy });
}

/**
 * A timed-out session is ended here, before passport reads it, so the request goes on signed
 * out (a guarded route answers 401, a screen redirects to sign-in). Any other request by a
 * signed-in person counts as activity; opening the live socket and a screen's own passive check
 * (PASSIVE_REQUEST_HEADER) do not: a screen reconnecting is not a person at the counter.
 */
type SessionRequest = IncomingMessage & {
  session?: session.Session & Partial<session.SessionData> & { passport?: { user?: unknown } };
  sessionID?: string;
};

async function enforceTimeouts(db: Knex, req: SessionRequest, policy: SessionPolicy, onExpired?: (sid: string) => void) {
  const s = req.session;
  if (!s?.passport?.user || !req.sessionID) return;
  const now = policy.now();
  if (expiryOf(s, now, policy)) {
    const sid = req.sessionID;
    await new Promise<void>((resolve, reject) => s.regenerate((err) => (err ? reject(err) : resolve())));
    onExpired?.(sid);
    return;
  }
  const person = req.headers.upgrade === undefined && req.headers[PASSIVE_REQUEST_HEADER] === undefined;
  if (s.signedInAt === undefined) return recordActivity(db, req.sessionID, now);
  if (person && now - (s.lastActiveAt ?? 0) >= policy.activityGapMs) await recordActivity(db, req.sessionID, now);
}

/**
 * Writes the activity into the stored row itself rather than through express-session: an UPDATE
 * can't bring back a row that a sign-out deleted meanwhile, where a save of the whole session could.
 * `minGapMs`: leave the row alone if it was marked active less than this long ago.
 */
export async function recordActivity(db: Knex, sid: string, now: number, minGapMs = 0): Promise<void> {
  const d = dialectOf(db);
  const stored = (key: string) => jsonNumberSql(d, 'sess', [key]);
  await db('sessions')
    .where({ sid })
    .andWhereRaw(`coalesce(${stored('lastActiveAt')}, 0) <= ?`, [now - minGapMs])
    .update({
      sess: db.raw(
        jsonSetNumbersSql(d, 'sess', [
          ['lastActiveAt', '?'],
          ['signedInAt', `coalesce(${stored('signedInAt')}, ?)`],
        ]),
        [now, now],
      ),
    });
}

/** A stored session as the live socket sees it: gone, timed out, or good. */
export async function storedSessionExpiry(db: Knex, sid: string, policy: SessionPolicy): Promise<Expiry | 'gone'> {
  const now = policy.now(); // as of the message that asked, not of whenever the read comes back
  const row = await db('sessions').where({ sid }).first('sess');
  if (!row) return 'gone';
  const sess = (typeof row.sess === 'string' ? JSON.parse(row.sess) : row.sess) as SessionTimes & { passport?: { user?: unknown } };
  if (!sess.passport?.user) return 'gone';
  return expiryOf(sess, now, policy);
}

/** Ends a stored session (a timed-out one the live socket found). */
export async function endSession(db: Knex, sid: string): Promise<void> {
  await db('sessions').where({ sid }).delete();
}

const toSessionUser = (u: Row<'users'>): SessionUser => ({
  id: u.id,
  name: u.name,
  role: u.role,
  locationId: u.location_id,
});

export async function findActiveUser(db: Knex, id: number): Promise<SessionUser | null> {
  const u = await db('users').where({ id }).first();
  return u && bool(u.active) ? toSessionUser(u) : null;
}

/** People of this many groups may share a sign-in name before the rest are not checked at sign-in. */
const SAME_NAME_GROUPS = 8;

/**
 * Whom a name and password sign in. A name is unique within a group of cafés, not across groups,
 * so it may belong to people of several groups, and the password tells them apart; every one of
 * their hashes is checked, and a dummy for a name nobody has, so a wrong password takes as long
 * whoever holds the name in that group. Two active people whose name and password both match
 * can't be told apart: refused (409) rather than one of them guessed.
 */
async function personSigningIn(db: Knex, username: string, password: string): Promise<Row<'users'> | null> {
  const rows = await db('users').where({ username }).orderBy('id').limit(SAME_NAME_GROUPS);
  if (rows.length === 0) {
    await verifyPassword(password, await getDummyHash());
    return null;
  }
  const matching: Row<'users'>[] = [];
  for (const u of rows) if ((await verifyPassword(password, u.password_hash)) && bool(u.active)) matching.push(u);
  if (matching.length > 1) {
    throw conflict('This sign-in name and password belong to people of two café groups. Ask your owner for a sign-in name of your own.');
  }
  return matching[0] ?? null;
}

export function createPassport(db: Knex, clock: () => Date = () => new Date()) {
  const passport = new Passport();
  passport.use(
    new LocalStrategy(async (username, password, done) => {
      try {
        const u = await personSigningIn(db, username, password);
        return done(null, u ? toSessionUser(u) : false);
      } catch (err) {
        return done(err);
      }
    }),
  );
  // Called once the sign-in has given the session its new id: the session's clocks start here.
  passport.serializeUser((req: IncomingMessage & { session?: Partial<session.SessionData> }, user: Express.User, done: (err: unknown, id?: number) => void) => {
    const now = clock().getTime();
    if (req.session) Object.assign(req.session, { signedInAt: now, lastActiveAt: now } satisfies SessionTimes);
    done(null, (user as SessionUser).id);
  });
  // the café in view comes from the session (an owner's choice), so it takes the request
  passport.deserializeUser(
    async (req: IncomingMessage & { session?: Partial<session.SessionData> }, id: number, done: (err: unknown, user?: SessionUser | false) => void) => {
      try {
        const user = await findActiveUser(db, id);
        done(null, user ? await inView(db, user, req.session?.cafeId) : false);
      } catch (err) {
        done(err);
      }
    },
  );
  return passport;
}

// A hash of a random string, made once, only to spend the same time on unknown names.
let dummyHash: Promise<string> | undefined;
const getDummyHash = () => (dummyHash ??= hashPassword(randomBytes(16).toString('hex')));
