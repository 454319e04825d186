// The back-office menu editor during server rendering: straight to the services.
import type { MenuAdminApi } from '@/lib/menu-admin-api';
import type { Deps } from '@server/deps';
import { loadAdminMenu } from '@server/menu/admin';

/** `locationId` throws 401 when nobody is signed in. */
export function menuAdminServerApi(deps: Deps, locationId: () => number): MenuAdminApi {
  return {
    editable: () => loadAdminMenu(deps.db, locationId()),
  };
}
