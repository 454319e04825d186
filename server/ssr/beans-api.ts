// Bean lots with their freshness and stock, and the dial-in log — during server rendering, straight to the services.
import { idParam } from '@/domain/schemas';
import type { BeansApi } from '@/lib/beans-api';
import { parse } from '@server/errors';
import { beansView } from '@server/beans/beans';
import type { Deps } from '@server/deps';
import { dialInView, lotShots } from '@server/beans/dial-in';

/** `locationId` throws 401 when nobody is signed in. Input is checked as the HTTP routes check it. */
export function beansServerApi(deps: Deps, locationId: () => number): BeansApi {
  return {
    lots: () => beansView(deps, locationId()),
    dialIn: () => dialInView(deps, locationId()),
    shots: async (lotId) => ({ shots: await lotShots(deps.db, locationId(), parse(idParam, { id: lotId }, 'params').id) }),
  };
}
