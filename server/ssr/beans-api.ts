// Bean lots with their freshness and stock, and the dial-in log. — during server rendering, straight to the services.
import type { BeansApi } from '../../src/lib/beans-api';
import type { Deps } from '../services/deps';

/** `locationId` throws 401 when nobody is signed in. */
export function beansServerApi(deps: Deps, locationId: () => number): BeansApi {
  void deps;
  void locationId;
  return {};
}
