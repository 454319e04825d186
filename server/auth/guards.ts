// Route guards: signed out → 401, signed in without the capability → 403. The same check stands
// before every read made during server rendering (server/reads.ts).
import type { NextFunction, Request, Response } from 'express';
import { can, type Capability } from '@/domain/roles';
import type { SessionUser } from '@/domain/types';
import { HttpError } from '@server/errors';

/** Why `user` may not do what `capability` allows (null: open to everyone), or null if they may. */
export function refusal(user: SessionUser | undefined, capability: Capability | null): HttpError | null {
  if (capability === null) return null;
  if (!user) return new HttpError(401, 'unauthenticated', 'Sign in first');
  if (!can(user.role, capability)) return new HttpError(403, 'forbidden', `Your role (${user.role}) can't do this`);
  return null;
}

export function requireCapability(capability: Capability) {
  return (req: Request, _res: Response, next: NextFunction) => {
    const refused = refusal(req.user, capability);
    if (refused) return next(refused);
    next();
  };
}

/** The signed-in user of a guarded route. */
export function userOf(req: Request): SessionUser {
  if (!req.user) throw new HttpError(401, 'unauthenticated', 'Sign in first');
  return req.user;
}
