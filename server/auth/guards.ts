// Route guards: signed out → 401, signed in without the capability → 403.
import type { NextFunction, Request, Response } from 'express';
import { can, type Capability } from '@/domain/roles';
import type { SessionUser } from '@/domain/types';
import { HttpError } from '@server/errors';

export function requireCapability(capability: Capability) {
  return (req: Request, _res: Response, next: NextFunction) => {
    if (!req.user) return next(new HttpError(401, 'unauthenticated', 'Sign in first'));
    if (!can(req.user.role, capability)) {
      return next(new HttpError(403, 'forbidden', `Your role (${req.user.role}) can't do this`));
    }
    next();
  };
}

/** The signed-in user of a guarded route. */
export function userOf(req: Request): SessionUser {
  if (!req.user) throw new HttpError(401, 'unauthenticated', 'Sign in first');
  return req.user;
}
