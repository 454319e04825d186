// What the Pulse board shows: live ticket times against the target, and whether to move people.
import type { BeanAlert } from './bean-stock';
import type { TipTotals } from './reports';
import type { WaitSummary } from './stats';
import type { ShiftView } from './types';
import type { WaitNow } from './wait-now';

export type { WaitSummary };

export interface PulseWindow {
  label: string;
  minutes: number | null; // null: the whole shift (or day)
  waits: WaitSummary;
  drinksPer15: number;
}

export interface PulseBucket {
  start: string;
  arrivals: number;
  drinks: number;
  medianWaitSeconds: number | null;
  p90WaitSeconds: number | null;
}

export interface PulseOpenTicket {
  id: number;
  number: number;
  customerName: string;
  firedAt: string;
  ageSeconds: number;
  drinks: number;
  drinksLeft: number;
  makers: string[];
}

export interface PulseView {
  now: string;
  targetSeconds: number;
  percentileMethod: string;
  shift: ShiftView | null;
  expectedCashCents: number | null;
  open: PulseOpenTicket[];
  windows: PulseWindow[];
  buckets: PulseBucket[];
  quoteVsActual: { count: number; meanQuotedSeconds: number | null; meanActualSeconds: number | null; shareLongerThanQuoted: number | null };
  perBarista: { name: string; drinks: number; medianMakeSeconds: number | null }[];
  perCategory: { category: string; drinks: number; medianMakeSeconds: number | null }[];
  staffing: {
    /**
     * What the estimate was made from, for the screen to say in café words: `arrivals` bar drinks
     * fired in the last `windowMinutes`; the bar's make time per drink per barista over the last
     * `paceMinutes` (the time the baristas were busy over the `drinksTimed` drinks they bumped,
     * steadied by 60 s a drink: 60 s when none was bumped); baristas on bar.
     */
    inputs: { arrivals: number; windowMinutes: number; paceMinutes: number; drinksTimed: number; meanMakeSeconds: number; baristas: number };
    now: { stable: boolean; probabilityOfWaiting: number; meanWaitSeconds: number | null };
    withOneMore: { stable: boolean; probabilityOfWaiting: number; meanWaitSeconds: number | null };
    /** A drink ordered now: the Counter's quote for one drink, and with one more barista. */
    waitNow: WaitNow;
    sentence: string;
  };
  alert: string | null;
  /** Coffee in the grinders running low or out, and lots past their best (src/domain/bean-stock.ts). */
  beanAlerts: BeanAlert[];
  /** Today's tips so far (the café-local date, as the day's report counts them); null when the
   * café takes no tips and none came today (pulseTips). */
  tipsToday: TipTotals | null;
}

/** Pulse shows today's tips while the café takes tips, or when some came today all the same
 * (tips turned off after the morning's): never a row of zeros for a café without them. */
export function pulseTips(tipsOn: boolean, today: TipTotals): TipTotals | null {
  return tipsOn || today.cents > 0 ? today : null;
}
