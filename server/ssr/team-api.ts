// The owner's team screen: staff accounts, roles, invitations, PINs. — during server rendering, straight to the services.
import type { TeamApi } from '@/lib/team-api';
import { tokenParam } from '@/domain/team-schemas';
import type { SessionUser } from '@/domain/types';
import { parse } from '@server/errors';
import type { Deps } from '@server/deps';
import { welcomeView } from '@server/team/invitations';
import { switchPeople } from '@server/team/pins';
import { listTeam } from '@server/team/team';

/** `locationId` throws 401 when nobody is signed in; `user` is the signed-in person, if any. */
export function teamServerApi(deps: Deps, locationId: () => number, user?: () => SessionUser): TeamApi {
  const me = (): SessionUser => {
    locationId();
    if (!user) throw new Error('teamServerApi needs the signed-in user');
    return user();
  };
  return {
    list: () => listTeam(deps, me()),
    welcome: (token) => welcomeView(deps, parse(tokenParam, { token }, 'params').token),
    switchPeople: async () => ({ people: await switchPeople(deps.db, me()) }),
  };
}
