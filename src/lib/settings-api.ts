// The location's settings: name, money, tax, units, wait target, pitchers, allergen list.
// Over HTTP in the browser; server/ssr/settings-api.ts is the server-rendering side.
import type { PitcherBody, SettingsBody, SettingsPage } from '@/domain/settings-schemas';
import { http } from './http';

/** What the settings screen reads (the server renders it from the services). */
export interface SettingsApi {
  settings(): Promise<SettingsPage>;
}

export const httpSettingsApi: SettingsApi = {
  settings: () => http('GET', '/settings'),
};

/** The owner's changes; each answers with the whole page again. Browser only. */
export const settingsCommands = {
  update: (body: SettingsBody | Record<string, unknown>) => http<SettingsPage>('PUT', '/settings', body),
  addPitcher: (body: PitcherBody) => http<SettingsPage>('POST', '/settings/pitchers', body),
  updatePitcher: (id: number, body: PitcherBody) => http<SettingsPage>('PUT', `/settings/pitchers/${id}`, body),
  removePitcher: (id: number) => http<SettingsPage>('DELETE', `/settings/pitchers/${id}`),
};
