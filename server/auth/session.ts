// Sessions in the same SQLite file (connect-session-knex), and passport-local sign-in.
import { randomBytes } from 'node:crypto';
import { ConnectSessionKnexStore } from 'connect-session-knex';
import session from 'express-session';
import type { Knex } from 'knex';
import { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { SessionUser } from '../../src/domain/types';
import { bool } from '../db/rows';
import { hashPassword, verifyPassword } from './passwords';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
  }
}

export const SESSION_COOKIE = 'jugline.sid';
/** Absolute session length: one working day (OWASP Session Management: 4–8 h). */
export const SESSION_MAX_AGE_MS = 8 * 60 * 60 * 1000;

export function createSessionMiddleware(db: Knex, secret: string, opts: { cleanupIntervalMs?: number } = {}) {
  const store = new ConnectSessionKnexStore({
    knex: db,
    tableName: 'sessions',
    createTable: false,
    cleanupInterval: opts.cleanupIntervalMs ?? 15 * 60 * 1000,
  });
  return session({
    name: SESSION_COOKIE,
    secret,
    store,
    resave: false,
    saveUninitialized: false,
    cookie: { httpOnly: true, sameSite: 'lax', secure: 'auto', maxAge: SESSION_MAX_AGE_MS },
  });
}

const toSessionUser = (u: Record<string, any>): SessionUser => ({
  id: u.id,
  name: u.name,
  role: u.role,
  locationId: u.location_id,
});

export async function findActiveUser(db: Knex, id: number): Promise<SessionUser | null> {
  const u = await db('users').where({ id }).first();
  return u && bool(u.active) ? toSessionUser(u) : null;
}

export function createPassport(db: Knex) {
  const passport = new Passport();
  passport.use(
    new LocalStrategy(async (username, password, done) => {
      try {
        const u = await db('users').where({ username }).first();
        // Compare against a hash even for an unknown name, so timing doesn't tell names apart.
        const ok = await verifyPassword(password, u?.password_hash ?? (await getDummyHash()));
        if (!u || !ok || !bool(u.active)) return done(null, false);
        return done(null, toSessionUser(u));
      } catch (err) {
        return done(err);
      }
    }),
  );
  passport.serializeUser((user, done) => done(null, (user as SessionUser).id));
  passport.deserializeUser(async (id: number, done) => {
    try {
      done(null, (await findActiveUser(db, id)) ?? false);
    } catch (err) {
      done(err);
    }
  });
  return passport;
}

// A hash of a random string, made once, only to spend the same time on unknown names.
let dummyHash: Promise<string> | undefined;
const getDummyHash = () => (dummyHash ??= hashPassword(randomBytes(16).toString('hex')));
