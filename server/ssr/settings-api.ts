// The location's settings: name, money, tax, units, wait target, pitchers, allergen list. — during server rendering, straight to the services.
import type { SettingsApi } from '@/lib/settings-api';
import type { Deps } from '@server/deps';
import { loadSettings } from '@server/settings/settings';

/** `locationId` throws 401 when nobody is signed in. */
export function settingsServerApi(deps: Deps, locationId: () => number): SettingsApi {
  return {
    settings: () => loadSettings(deps.db, locationId()),
  };
}
