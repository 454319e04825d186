// The owner's changes to the location's settings: name, money, tax, units, wait target, pitchers,
// allergen list. The settings page itself is a read (`api.settings()`, src/reads.ts).
import type { PitcherBody, SettingsBody, SettingsPage } from '@/domain/settings-schemas';
import { http } from './http';

/** The owner's changes; each answers with the whole page again. Browser only. */
export const settingsCommands = {
  update: (body: SettingsBody | Record<string, unknown>) => http<SettingsPage>('PUT', '/settings', body),
  addPitcher: (body: PitcherBody) => http<SettingsPage>('POST', '/settings/pitchers', body),
  updatePitcher: (id: number, body: PitcherBody) => http<SettingsPage>('PUT', `/settings/pitchers/${id}`, body),
  removePitcher: (id: number) => http<SettingsPage>('DELETE', `/settings/pitchers/${id}`),
};
