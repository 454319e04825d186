// Bean lots with their freshness and stock, and the dial-in log — during server rendering, straight to the services.
import { idParam } from '../../src/domain/schemas';
import type { BeansApi } from '../../src/lib/beans-api';
import { parse } from '../errors';
import { beansView } from '../beans/beans';
import type { Deps } from '../deps';
import { dialInView, lotShots } from '../beans/dial-in';

/** `locationId` throws 401 when nobody is signed in. Input is checked as the HTTP routes check it. */
export function beansServerApi(deps: Deps, locationId: () => number): BeansApi {
  return {
    lots: () => beansView(deps, locationId()),
    dialIn: () => dialInView(deps, locationId()),
    shots: async (lotId) => ({ shots: await lotShots(deps.db, locationId(), parse(idParam, { id: lotId }, 'params').id) }),
  };
}
