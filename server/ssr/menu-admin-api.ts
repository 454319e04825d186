// The back-office menu editor during server rendering: straight to the services.
import type { MenuAdminApi } from '../../src/lib/menu-admin-api';
import type { Deps } from '../deps';
import { loadAdminMenu } from '../menu/admin';

/** `locationId` throws 401 when nobody is signed in. */
export function menuAdminServerApi(deps: Deps, locationId: () => number): MenuAdminApi {
  return {
    editable: () => loadAdminMenu(deps.db, locationId()),
  };
}
