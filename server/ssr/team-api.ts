// The owner's team screen: staff accounts, roles, invitations, PINs. — during server rendering, straight to the services.
import type { TeamApi } from '../../src/lib/team-api';
import { tokenParam } from '../../src/domain/team-schemas';
import type { SessionUser } from '../../src/domain/types';
import { parse } from '../errors';
import type { Deps } from '../deps';
import { welcomeView } from '../team/invitations';
import { switchPeople } from '../team/pins';
import { listTeam } from '../team/team';

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
