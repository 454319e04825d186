// The location's settings: name, money, tax, units, wait target, pitchers, allergen list.
// Over HTTP in the browser; server/ssr/settings-api.ts is the server-rendering side.
import { http } from './http';

// eslint-disable-next-line @typescript-eslint/no-empty-object-type
export interface SettingsApi {}

void http;
export const httpSettingsApi: SettingsApi = {};
