// Dial-in: a test shot's brew ratio and what to change next. Doses and yields are in tenths of a
// gram and times in tenths of a second, so every comparison is on whole numbers.
import { brewRatioX10, formatRatio } from './format';

/** The location's target for a shot; the dose range comes from the house recipe. */
export interface ShotWindow {
  doseMinDg: number;
  doseMaxDg: number;
  timeMinS: number;
  timeMaxS: number;
  /** Brew ratio (yield ÷ dose) in tenths: 1:2.0 is 20. */
  ratioMinX10: number;
  ratioMaxX10: number;
}

export interface ShotTargets {
  timeMinS: number;
  timeMaxS: number;
  ratioMinX10: number;
  ratioMaxX10: number;
}

/** Common practice: a brew ratio of about 1:2 and a shot time of about 25–30 s. The ±0.2 on the
 * ratio is our own choice of "about". */
export const DEFAULT_SHOT_TARGETS: ShotTargets = { timeMinS: 25, timeMaxS: 30, ratioMinX10: 18, ratioMaxX10: 22 };

/** Common practice: a double takes 18–22 g; with a house recipe, its dose ± 1 g. */
export const COMMON_DOUBLE_DOSE = { doseMinDg: 180, doseMaxDg: 220 };
export const RECIPE_DOSE_TOLERANCE_DG = 10;

export function doseRange(recipeDoseDg: number | null): { doseMinDg: number; doseMaxDg: number } {
  if (!recipeDoseDg || recipeDoseDg <= 0) return COMMON_DOUBLE_DOSE;
  return { doseMinDg: recipeDoseDg - RECIPE_DOSE_TOLERANCE_DG, doseMaxDg: recipeDoseDg + RECIPE_DOSE_TOLERANCE_DG };
}

export interface ShotInput {
  doseDg: number;
  yieldDg: number;
  timeDs: number;
}

// The advice judges the ratio as it is shown (brewRatioX10: yield ÷ dose in tenths, the one
// formatter every screen uses).
export const formatGrams = (dg: number) => `${(dg / 10).toFixed(1)} g`;
export const formatSeconds = (ds: number) => `${ds % 10 === 0 ? ds / 10 : (ds / 10).toFixed(1)} s`;

export const ADVICE_CODES = ['dose', 'fast', 'slow', 'ratio-short', 'ratio-long', 'good'] as const;
export type AdviceCode = (typeof ADVICE_CODES)[number];

export const ADVICE_HEADLINE: Record<AdviceCode, string> = {
  dose: 'Adjust the dose first',
  fast: 'Ran fast: grind finer',
  slow: 'Ran slow: grind coarser',
  'ratio-short': 'Time is right, ratio short: pull a bigger yield',
  'ratio-long': 'Time is right, ratio long: stop the shot sooner',
  good: 'In the window — keep these settings',
};

export interface ShotAdvice {
  code: AdviceCode;
  good: boolean;
  ratioX10: number;
  headline: string;
  detail: string;
}

const ratioLabel = (w: ShotWindow) => `${formatRatio(w.ratioMinX10)}–${formatRatio(w.ratioMaxX10).slice('1:'.length)}`;
const timeLabel = (w: ShotWindow) => `${w.timeMinS}–${w.timeMaxS} s`;

/**
 * One change at a time, in the usual order: the dose first (it sets everything else), then the
 * grind by the shot time, then the yield by the ratio.
 */
export function adviseShot(shot: ShotInput, w: ShotWindow): ShotAdvice {
  const ratioX10 = brewRatioX10(shot.doseDg, shot.yieldDg);
  const advice = (code: AdviceCode, detail: string): ShotAdvice => ({ code, good: code === 'good', ratioX10, headline: ADVICE_HEADLINE[code], detail });
  const time = formatSeconds(shot.timeDs);
  if (shot.doseDg < w.doseMinDg || shot.doseDg > w.doseMaxDg) {
    return advice(
      'dose',
      `${formatGrams(shot.doseDg)} is outside ${(w.doseMinDg / 10).toFixed(1)}–${formatGrams(w.doseMaxDg)}; weigh the dose again before you touch the grind.`,
    );
  }
  if (shot.timeDs < w.timeMinS * 10) return advice('fast', `${time} is under ${timeLabel(w)}.`);
  if (shot.timeDs > w.timeMaxS * 10) return advice('slow', `${time} is over ${timeLabel(w)}.`);
  const aimDg = Math.round((shot.doseDg * (w.ratioMinX10 + w.ratioMaxX10)) / 20);
  if (ratioX10 < w.ratioMinX10) return advice('ratio-short', `under ${ratioLabel(w)}; aim for about ${formatGrams(aimDg)} out.`);
  if (ratioX10 > w.ratioMaxX10) return advice('ratio-long', `over ${ratioLabel(w)}; aim for about ${formatGrams(aimDg)} out.`);
  return advice('good', `${time}: inside ${ratioLabel(w)} and ${timeLabel(w)}.`);
}

/** A logged test shot, as the screens show it. */
export interface DialInShotView {
  id: number;
  lotId: number;
  grind: string;
  doseDg: number;
  yieldDg: number;
  timeDs: number;
  ratioX10: number;
  advice: AdviceCode;
  good: boolean;
  tasteNote: string | null;
  pulledBy: string;
  pulledAt: string;
}
