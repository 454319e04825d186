// Bean lots with their freshness and stock, and the dial-in log.
import type { Deps } from '../services/deps';
import type { ApiRoute } from './define';

export function beanRoutes(deps: Deps): ApiRoute[] {
  void deps;
  return [];
}
