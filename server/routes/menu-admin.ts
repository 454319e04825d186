// The back-office menu editor: categories, items, sizes and recipes, milks, modifiers, import.
import type { Deps } from '../services/deps';
import type { ApiRoute } from './define';

export function menuAdminRoutes(deps: Deps): ApiRoute[] {
  void deps;
  return [];
}
