import type { QueryClient } from '@tanstack/react-query';
import { data, redirect } from 'react-router';
import { can, type Capability } from '@/domain/roles';
import { sessionQuery } from '@/queries/session';
import type { PublicUser } from '@/domain/types';
import type { Api } from '@/lib/api';

/** What route loaders receive: the request's QueryClient and the api to fill it from. */
export interface RouteDeps {
  queryClient: QueryClient;
  api: Api;
}

/** Signed out → to sign-in and back; signed in without the capability → a 403 page. */
export async function requireScreen(deps: RouteDeps, request: Request, capability: Capability): Promise<PublicUser> {
  const { user } = await deps.queryClient.ensureQueryData(sessionQuery(deps.api));
  if (!user) {
    const url = new URL(request.url);
    throw redirect(`/signin?next=${encodeURIComponent(url.pathname + url.search)}`);
  }
  if (!can(user.role, capability)) {
    throw data({ message: `This screen is not open to the ${user.role} role.` }, { status: 403, statusText: 'Forbidden' });
  }
  return user;
}

/** A screen's `:id` as a positive integer, or a 404 page. */
export function orderIdFrom(params: Record<string, string | undefined>): number {
  const id = Number(params.id);
  if (!Number.isInteger(id) || id <= 0) throw data({ message: 'There is no such order.' }, { status: 404, statusText: 'Not Found' });
  return id;
}

/** A record the api says isn't there (404 from the server or the services) becomes the 404 page. */
export async function orNotFound<T>(work: Promise<T>): Promise<T> {
  try {
    return await work;
  } catch (err) {
    if ((err as { status?: number })?.status === 404) {
      throw data({ message: 'There is no such order.' }, { status: 404, statusText: 'Not Found' });
    }
    throw err;
  }
}
