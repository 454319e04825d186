// Every API route is declared as data (method, path, who may call it, handler) so that the
// role matrix in the tests is generated from the same list the app mounts.
import { Router, type RequestHandler } from 'express';
import type { Capability } from '@/domain/roles';
import { requireCapability } from './auth/guards';

export interface ApiRoute {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  /** null: open to everyone, signed in or not. */
  capability: Capability | null;
  /** Run before the guard, e.g. a rate limit. */
  before?: RequestHandler[];
  handler: RequestHandler;
}

export function mountRoutes(routes: ApiRoute[]): Router {
  const router = Router();
  for (const r of routes) {
    const guards = r.capability ? [requireCapability(r.capability)] : [];
    router[r.method](r.path, ...(r.before ?? []), ...guards, r.handler);
  }
  return router;
}
