import type { Request, Response, NextFunction } from 'express';
import type { createPassport } from '../auth/session';
import { signInBody } from '../../src/domain/schemas';
import type { SessionUser } from '../../src/domain/types';
import { HttpError, parse } from '../errors';
import { signInThrottle } from '../security';
import type { Deps } from '../services/deps';
import type { ApiRoute } from './define';

const publicUser = (u: SessionUser) => ({ id: u.id, name: u.name, role: u.role });

export function sessionRoutes(passport: ReturnType<typeof createPassport>, deps: Deps): ApiRoute[] {
  const signIn = (req: Request, res: Response, next: NextFunction) => {
    req.body = parse(signInBody, req.body);
    const previous = req.sessionID; // the session the cookie named, if any, and its live sockets
    passport.authenticate('local', { session: true }, (err: unknown, user: SessionUser | false) => {
      if (err) return next(err);
      if (!user) return next(new HttpError(401, 'unauthenticated', 'That name and password do not match'));
      // passport ≥ 0.6 regenerates the session id here, so a planted id is never promoted.
      req.logIn(user, (loginErr) => {
        if (loginErr) return next(loginErr);
        // the replaced session is over: its screens close now (4401), not at a heartbeat a minute
        // on, still showing names and allergy notes meanwhile
        if (previous !== req.sessionID) deps.sessions.emit('signed-out', previous);
        res.json({ user: publicUser(user) });
      });
    })(req, res, next);
  };

  return [
    { method: 'post', path: '/session', capability: null, before: signInThrottle(), handler: signIn },
    {
      method: 'get',
      path: '/session',
      capability: null,
      handler: (req, res) => res.json({ user: req.user ? publicUser(req.user) : null }),
    },
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
