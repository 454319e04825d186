// The location's settings: name, money, tax, units, wait target, pitchers, allergen list. — during server rendering, straight to the services.
import type { SettingsApi } from '../../src/lib/settings-api';
import type { Deps } from '../services/deps';

/** `locationId` throws 401 when nobody is signed in. */
export function settingsServerApi(deps: Deps, locationId: () => number): SettingsApi {
  void deps;
  void locationId;
  return {};
}
