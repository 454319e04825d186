// Bean lots with their freshness and stock, and the dial-in log.
// Over HTTP in the browser; server/ssr/beans-api.ts is the server-rendering side.
import type { BeanLotView, BeanSettingsView } from '@/domain/bean-stock';
import type { BeanLotBody, BeanSettingsBody, DialInShotBody } from '@/domain/beans-schemas';
import type { DialInShotView, ShotAdvice, ShotWindow } from '@/domain/dial-in';
import { http } from './http';

export interface BeansView {
  today: string;
  now: string;
  timeZone: string;
  locale: string;
  settings: BeanSettingsView;
  lots: BeanLotView[];
}

export interface DialInView {
  today: string;
  now: string;
  timeZone: string;
  locale: string;
  window: ShotWindow;
  /** The house double's dose the dose range is built on; null: the common 18–22 g. */
  recipeDoseDg: number | null;
  /** Lots that are not retired; the Bar's strip shows those in a grinder. */
  lots: BeanLotView[];
  espressoLotId: number | null;
}

export interface LoggedShot {
  shot: DialInShotView;
  advice: ShotAdvice;
  lot: BeanLotView;
}

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
