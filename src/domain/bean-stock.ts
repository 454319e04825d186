// A bean lot's stock: what is left, when it will run out at the pace it is used, and when to warn.
// Weights in tenths of a gram, as recipe doses are.
import type { DialInShotView } from './dial-in';
import { addDays, daysBetween, type FreshnessState } from './freshness';
import { businessDate } from './business-date';

export const HOPPERS = ['espresso', 'decaf', 'shelf'] as const;
export type Hopper = (typeof HOPPERS)[number];
export const HOPPER_LABEL: Record<Hopper, string> = { espresso: 'Espresso', decaf: 'Decaf', shelf: 'Shelf' };

/** A drink with a decaf extra draws from the decaf grinder; every other drink from the espresso one. */
export function drinkHopper(extraNames: string[]): 'espresso' | 'decaf' {
  return extraNames.some((n) => /\bdecaf/i.test(n)) ? 'decaf' : 'espresso';
}

/** Coffee taken from a lot: a bumped drink's dose or a dial-in shot's. */
export interface UsePoint {
  at: string;
  doseDg: number;
}

/** How many past days the pace looks back over. */
export const PACE_DAYS = 7;
/** Under this much shift time the pace is too noisy to project. */
export const MIN_SHIFT_PACE_MS = 15 * 60_000;

export type RunsOut =
  | { basis: 'none' }
  | { basis: 'empty' }
  /** Average use per café day over the last `days` full days (at most 7). */
  | { basis: 'days'; days: number; perDayDg: number; daysLeft: number; at: string }
  /** Fewer than one full day of use: this shift's pace per hour, in hours of service. */
  | { basis: 'shift'; perHourDg: number; hoursLeft: number; at: string };

export interface RunsOutInput {
  remainingDg: number;
  uses: UsePoint[];
  now: Date;
  timeZone: string;
  /** When the open shift began (else the pace runs from the lot's first use today). */
  shiftStart: string | null;
}

export function runsOut({ remainingDg, uses, now, timeZone, shiftStart }: RunsOutInput): RunsOut {
  if (remainingDg <= 0) return { basis: 'empty' };
  const nowMs = now.getTime();
  const past = uses.filter((u) => Date.parse(u.at) <= nowMs);
  if (past.length === 0) return { basis: 'none' };
  const today = businessDate(now, timeZone);
  const dayOf = (u: UsePoint) => businessDate(new Date(u.at), timeZone);
  const firstDay = past.map(dayOf).sort()[0];

  // full days before today, back to the lot's first day of use, at most a week
  const days = Math.min(PACE_DAYS, daysBetween(firstDay, today));
  if (days >= 1) {
    const from = addDays(today, -days);
    const used = past.filter((u) => dayOf(u) >= from && dayOf(u) < today).reduce((s, u) => s + u.doseDg, 0);
    const perDayDg = used / days;
    if (perDayDg <= 0) return { basis: 'none' };
    const daysLeft = remainingDg / perDayDg;
    return { basis: 'days', days, perDayDg, daysLeft, at: new Date(nowMs + daysLeft * 86_400_000).toISOString() };
  }

  const todays = past.filter((u) => dayOf(u) === today);
  const startMs = Math.min(shiftStart ? Date.parse(shiftStart) : Infinity, ...todays.map((u) => Date.parse(u.at)));
  const spanMs = nowMs - startMs;
  if (spanMs < MIN_SHIFT_PACE_MS) return { basis: 'none' };
  const perHourDg = todays.reduce((s, u) => s + u.doseDg, 0) / (spanMs / 3_600_000);
  const hoursLeft = remainingDg / perHourDg;
  return { basis: 'shift', perHourDg, hoursLeft, at: new Date(nowMs + hoursLeft * 3_600_000).toISOString() };
}

export type StockState = 'ok' | 'low' | 'empty';

/** Low: under the owner's threshold, or under one day of use at the recent daily pace. */
export function stockState(remainingDg: number, estimate: RunsOut, lowStockG: number): StockState {
  if (remainingDg <= 0) return 'empty';
  if (remainingDg < lowStockG * 10) return 'low';
  if (estimate.basis === 'days' && estimate.daysLeft < 1) return 'low';
  return 'ok';
}

export interface BeanLotView {
  id: number;
  name: string;
  roaster: string;
  origin: string | null;
  notes: string | null;
  roastDate: string;
  receivedDate: string;
  receivedG: number;
  hopper: Hopper;
  restDays: number;
  bestUntilDays: number;
  retiredAt: string | null;
  daysSinceRoast: number;
  freshness: FreshnessState;
  usedDg: number;
  remainingDg: number;
  runsOut: RunsOut;
  stock: StockState;
  /** The latest dial-in shot in the window for this lot. */
  lastGood: DialInShotView | null;
}

export interface BeanSettingsView {
  timeMinS: number;
  timeMaxS: number;
  ratioMinX10: number;
  ratioMaxX10: number;
  /** Warn when a lot in a grinder has less than this. */
  lowStockG: number;
}

/** Our own default (about 26 doubles at 19 g); the owner sets their own. */
export const DEFAULT_LOW_STOCK_G = 500;

export interface BeanAlert {
  lotId: number;
  lotName: string;
  kind: 'low' | 'empty' | 'fading';
  message: string;
}

const kg = (dg: number) => (dg >= 10_000 ? `${(dg / 10_000).toFixed(1)} kg` : `${Math.max(0, Math.round(dg / 10))} g`);

/** What Pulse warns about: lots in a grinder that are low or empty, and any active lot past its best. */
export function beanAlerts(lots: BeanLotView[]): BeanAlert[] {
  const alerts: BeanAlert[] = [];
  for (const lot of lots) {
    if (lot.retiredAt) continue;
    const where = lot.hopper === 'shelf' ? 'on the shelf' : `in the ${lot.hopper} grinder`;
    if (lot.hopper !== 'shelf' && lot.stock === 'empty') {
      alerts.push({ lotId: lot.id, lotName: lot.name, kind: 'empty', message: `${lot.name} ${where} is used up — refill it and retire the lot` });
    } else if (lot.hopper !== 'shelf' && lot.stock === 'low') {
      const left = lot.runsOut.basis === 'days' || lot.runsOut.basis === 'shift' ? `; runs out ${runsOutPhrase(lot.runsOut)}` : '';
      alerts.push({ lotId: lot.id, lotName: lot.name, kind: 'low', message: `${lot.name} ${where} is low: ${kg(lot.remainingDg)} left${left}` });
    }
    if (lot.freshness === 'fading' && lot.stock !== 'empty') {
      alerts.push({
        lotId: lot.id,
        lotName: lot.name,
        kind: 'fading',
        message: `${lot.name} ${where} is past its best: ${lot.daysSinceRoast} days since roast`,
      });
    }
  }
  return alerts;
}

/** "in about 2.5 days" / "in about 3 h of service" — the estimate in words. */
export function runsOutPhrase(r: RunsOut): string {
  if (r.basis === 'days') return `in about ${r.daysLeft < 10 ? r.daysLeft.toFixed(1) : Math.round(r.daysLeft)} days`;
  if (r.basis === 'shift') return `in about ${r.hoursLeft < 10 ? r.hoursLeft.toFixed(1) : Math.round(r.hoursLeft)} h of service`;
  if (r.basis === 'empty') return 'now';
  return '—';
}
