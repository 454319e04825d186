// Bean lots with their freshness and stock, and the dial-in log.
// Over HTTP in the browser; server/ssr/beans-api.ts is the server-rendering side.
import type { BeanLotView, BeanSettingsView } from '@/domain/bean-stock';
import type { BeanLotBody, BeanSettingsBody, BeansView, DialInShotBody, DialInView, LoggedShot } from '@/domain/beans-schemas';
import type { DialInShotView } from '@/domain/dial-in';
import { http } from './http';

/** What the screens read. */
export interface BeansApi {
  /** Every lot, retired ones last, and the location's dial-in window (owner). */
  lots(): Promise<BeansView>;
  /** Lots in use, the window and the lot in the espresso grinder (barista and up). */
  dialIn(): Promise<DialInView>;
  /** A lot's latest test shots, newest first. */
  shots(lotId: number): Promise<{ shots: DialInShotView[] }>;
}

export const httpBeansApi: BeansApi = {
  lots: () => http('GET', '/beans'),
  dialIn: () => http('GET', '/dial-in'),
  shots: (lotId) => http('GET', `/dial-in/lots/${lotId}/shots`),
};

/** The commands, from the browser only (server rendering never changes anything). */
export const beanCommands = {
  createLot: (body: BeanLotBody) => http<{ lot: BeanLotView }>('POST', '/beans/lots', body),
  updateLot: (id: number, body: BeanLotBody) => http<{ lot: BeanLotView }>('PUT', `/beans/lots/${id}`, body),
  retireLot: (id: number) => http<{ lot: BeanLotView }>('POST', `/beans/lots/${id}/retire`),
  saveSettings: (body: BeanSettingsBody) => http<{ settings: BeanSettingsView }>('PUT', '/beans/settings', body),
  logShot: (body: DialInShotBody) => http<LoggedShot>('POST', '/dial-in/shots', body),
};
