import type { Request, Response, NextFunction } from 'express';
import { ipKeyGenerator } from 'express-rate-limit';
import type { createPassport } from './session';
import { signInBody } from '@/domain/schemas';
import type { SessionUser } from '@/domain/types';
import { sessionView } from './cafe-in-view';
import { knownTerminals } from './known-terminal';
import { SignInThrottle, type Outcome, type SignInCounts } from './sign-in-throttle';
import { HttpError, parse } from '@server/errors';
import type { Clock, Deps } from '@server/deps';
import type { ApiRoute } from '@server/routes';

/** The clock and the pause of sign-in pacing; tests pass a virtual pair, so nothing waits in real time. */
export interface SignInPacing {
  clock?: Clock;
  sleep?: (ms: number) => Promise<void>;
}

// unref: a pause never keeps a stopping process alive
const realSleep = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms).unref());

export function sessionRoutes(
  passport: ReturnType<typeof createPassport>,
  deps: Deps,
  opts: { secret: string; pacing?: SignInPacing; counts?: SignInCounts },
): ApiRoute[] {
  const clock = opts.pacing?.clock ?? (() => new Date());
  const throttle = new SignInThrottle(() => clock().getTime(), opts.pacing?.sleep ?? realSleep, opts.counts);
  const terminals = knownTerminals(opts.secret);

  const signIn = async (req: Request, res: Response, next: NextFunction) => {
    req.body = parse(signInBody, req.body);
    const name = req.body.username.toLowerCase();
    const admission = await throttle.admit({ name, address: ipKeyGenerator(req.ip ?? 'unknown'), terminal: terminals.idFor(req, name) });
    if (!admission.ok) {
      res.set('Retry-After', String(Math.ceil(admission.retryAfterMs / 1000)));
      throw new HttpError(admission.status, admission.status === 503 ? 'unavailable' : 'rate_limited', admission.message);
    }
    const previous = req.sessionID; // the session the cookie named, if any, and its live sockets
    let outcome: Outcome = 'not-checked';
    try {
      await admission.turn();
      // the client gave up while waiting its turn: no password is checked, nothing counts
      if (req.socket.destroyed) return;
      await new Promise<void>((resolve, reject) => {
        passport.authenticate('local', { session: true }, (err: unknown, user: SessionUser | false) => {
          if (err) return reject(err);
          if (!user) {
            outcome = 'failed';
            return reject(new HttpError(401, 'unauthenticated', 'That name and password do not match'));
          }
          outcome = 'signed-in';
          // passport ≥ 0.6 regenerates the session id here, so a planted id is never promoted.
          req.logIn(user, (loginErr) => {
            if (loginErr) return reject(loginErr);
            // the replaced session is over: its screens close now (4401), not at a heartbeat a minute
            // on, still showing names and allergy notes meanwhile
            if (previous !== req.sessionID) deps.sessions.emit('signed-out', previous);
            terminals.remember(req, res, name);
            // the same answer as GET /api/session, so the screen needs no second read
            sessionView(deps.db, user).then((view) => {
              res.json(view);
              resolve();
            }, reject);
          });
        })(req, res, next);
      });
    } finally {
      await admission.settle(outcome);
    }
  };

  // Plain routes, not commands (src/commands.ts): passport answers the sign-in itself, once the
  // throttle's turn has come, and the sign-out ends the session it came with.
  return [
    { method: 'post', path: '/session', capability: null, handler: signIn },
    {
      method: 'delete',
      path: '/session',
      capability: null,
      handler: (req, res, next) => {
        const sid = req.sessionID; // the id the person's live sockets were opened with
        req.logOut((err) => {
          if (err) return next(err);
          deps.sessions.emit('signed-out', sid);
          req.session.destroy((destroyErr) => (destroyErr ? next(destroyErr) : res.status(204).end()));
        });
      },
    },
  ];
}
