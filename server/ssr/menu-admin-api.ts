// The back-office menu editor: categories, items, sizes and recipes, milks, modifiers, import. — during server rendering, straight to the services.
import type { MenuAdminApi } from '../../src/lib/menu-admin-api';
import type { Deps } from '../services/deps';

/** `locationId` throws 401 when nobody is signed in. */
export function menuAdminServerApi(deps: Deps, locationId: () => number): MenuAdminApi {
  void deps;
  void locationId;
  return {};
}
