// What screens read, as one interface: over HTTP in the browser, straight from the services
// during server rendering (so a page render makes no network round trip).
import type { OutboxView } from '@/domain/outbox';
import type { PickupBoard } from '@/domain/pickup';
import type { PulseView } from '@/domain/pulse';
import type { CounterWaitNow } from '@/domain/wait-now';
import type { BoardSnapshot, MenuView, OrderView, PublicUser } from '@/domain/types';
import { http } from './http';
import { httpBeansApi, type BeansApi } from './beans-api';
import { httpMenuAdminApi, type MenuAdminApi } from './menu-admin-api';
import { httpReportsApi, type ReportsApi } from './reports-api';
import { httpSettingsApi, type SettingsApi } from './settings-api';
import { httpTeamApi, type TeamApi } from './team-api';

export interface Api {
  session(): Promise<{ user: PublicUser | null }>;
  menu(): Promise<MenuView>;
  tickets(): Promise<BoardSnapshot>;
  /** The Pickup screen's board: first names, numbers, status and ready times only. */
  pickup(): Promise<PickupBoard>;
  /** Today's orders, newest first; `q` matches a name or number. */
  orders(q?: string): Promise<{ orders: OrderView[] }>;
  order(id: number): Promise<{ order: OrderView }>;
  /** The shift lead's live numbers. */
  pulse(): Promise<PulseView>;
  /** The wait a customer would be quoted now for `drinks` bar drinks (the Counter, before payment). */
  waitNow(drinks: number): Promise<{ waitNow: CounterWaitNow }>;
  /** Mail the local SMTP fake caught for this café, newest first. */
  outbox(): Promise<OutboxView>;
  /** Reports for the lead and the owner (src/lib/reports-api.ts). */
  reports: ReportsApi;
  /** Back office (src/lib/*-api.ts). */
  menuAdmin: MenuAdminApi;
  team: TeamApi;
  settings: SettingsApi;
  beans: BeansApi;
}

export const httpApi: Api = {
  session: () => http('GET', '/session'),
  menu: () => http('GET', '/menu'),
  tickets: () => http('GET', '/tickets?view=board'),
  pickup: () => http('GET', '/pickup'),
  // the Outbox refreshes itself every few seconds: that alone mustn't keep a session awake
  outbox: () => http('GET', '/outbox', undefined, { passive: true }),
  reports: httpReportsApi,
  menuAdmin: httpMenuAdminApi,
  team: httpTeamApi,
  settings: httpSettingsApi,
  beans: httpBeansApi,
  orders: (q) => http('GET', `/orders${q ? `?q=${encodeURIComponent(q)}` : ''}`),
  order: (id) => http('GET', `/orders/${id}`),
  pulse: () => http('GET', '/pulse'),
  // a glance the Counter refreshes as the bar moves: not activity that keeps a session awake
  waitNow: (drinks) => http('GET', `/wait-now?drinks=${drinks}`, undefined, { passive: true }),
};
