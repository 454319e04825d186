// The commands of the bean lots and the dial-in log. What the screens read (`api.beans()`,
// `api.dialIn()`, `api.lotShots({ id })`) is in src/reads.ts.
import type { BeanLotView, BeanSettingsView } from '@/domain/bean-stock';
import type { BeanLotBody, BeanSettingsBody, DialInShotBody, LoggedShot } from '@/domain/beans-schemas';
import { http } from './http';

/** The commands, from the browser only (server rendering never changes anything). */
export const beanCommands = {
  createLot: (body: BeanLotBody) => http<{ lot: BeanLotView }>('POST', '/beans/lots', body),
  updateLot: (id: number, body: BeanLotBody) => http<{ lot: BeanLotView }>('PUT', `/beans/lots/${id}`, body),
  retireLot: (id: number) => http<{ lot: BeanLotView }>('POST', `/beans/lots/${id}/retire`),
  saveSettings: (body: BeanSettingsBody) => http<{ settings: BeanSettingsView }>('PUT', '/beans/settings', body),
  logShot: (body: DialInShotBody) => http<LoggedShot>('POST', '/dial-in/shots', body),
};
