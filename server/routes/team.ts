// The owner's team screen: staff accounts, roles, invitations, PINs.
import type { Deps } from '../services/deps';
import type { ApiRoute } from './define';

export function teamRoutes(deps: Deps): ApiRoute[] {
  void deps;
  return [];
}
