// The location's settings: name, money, tax, units, wait target, pitchers, allergen list.
import type { Deps } from '../services/deps';
import type { ApiRoute } from './define';

export function settingsRoutes(deps: Deps): ApiRoute[] {
  void deps;
  return [];
}
