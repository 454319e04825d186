// The owner's team screen: staff accounts, roles, invitations, PINs. — during server rendering, straight to the services.
import type { TeamApi } from '../../src/lib/team-api';
import type { Deps } from '../services/deps';

/** `locationId` throws 401 when nobody is signed in. */
export function teamServerApi(deps: Deps, locationId: () => number): TeamApi {
  void deps;
  void locationId;
  return {};
}
