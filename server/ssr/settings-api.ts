// The location's settings: name, money, tax, units, wait target, pitchers, allergen list. — during server rendering, straight to the services.
import type { SettingsApi } from '../../src/lib/settings-api';
import type { Deps } from '../deps';
import { loadSettings } from '../settings/settings';

/** `locationId` throws 401 when nobody is signed in. */
export function settingsServerApi(deps: Deps, locationId: () => number): SettingsApi {
  return {
    settings: () => loadSettings(deps.db, locationId()),
  };
}
