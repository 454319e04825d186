// Request bodies of the bean lots and the dial-in log, shared by the forms and the routes, and
// what the beans and dial-in reads answer.
import { z } from 'zod';
import { HOPPERS, type BeanLotView, type BeanSettingsView } from './bean-stock';
import type { DialInShotView, ShotAdvice, ShotWindow } from './dial-in';
import { calendarDate } from './schemas';
import { plainText } from './text';

const text = (max: number, empty: string) => plainText(empty).min(1, empty).max(max, `At most ${max} characters`);
const optionalText = (max: number) => plainText().max(max, `At most ${max} characters`).optional();
const whole = (min: number, max: number, what: string) =>
  z.number(`Enter ${what}`).int(`Enter ${what} as a whole number`).min(min, `At least ${min}`).max(max, `At most ${max}`);

const bothDates = (b: { roastDate: string; receivedDate: string }) =>
  calendarDate.safeParse(b.roastDate).success && calendarDate.safeParse(b.receivedDate).success;

/** A bean lot as the owner enters it: POST /api/beans/lots and PUT /api/beans/lots/:id. */
export const beanLotBody = z
  .object({
    name: text(60, 'Name the lot'),
    roaster: text(60, 'Name the roaster'),
    origin: optionalText(120),
    notes: optionalText(200),
    roastDate: calendarDate,
    receivedDate: calendarDate,
    receivedG: whole(1, 100_000, 'the weight in grams'),
    hopper: z.enum(HOPPERS, 'Espresso, decaf or shelf'),
    restDays: whole(0, 60, 'the resting days'),
    bestUntilDays: whole(1, 365, 'the last best day'),
  })
  // only once both dates are real dates; else the date's own message says what is wrong
  .refine((b) => !bothDates(b) || b.receivedDate >= b.roastDate, { message: 'Received before it was roasted?', path: ['receivedDate'] })
  .refine((b) => b.bestUntilDays > b.restDays, { message: 'The best window ends after the resting days', path: ['bestUntilDays'] });
export type BeanLotBody = z.infer<typeof beanLotBody>;

/** The location's dial-in window and low-stock line: PUT /api/beans/settings. */
export const beanSettingsBody = z
  .object({
    timeMinS: whole(5, 90, 'the shortest shot time'),
    timeMaxS: whole(5, 90, 'the longest shot time'),
    ratioMinX10: whole(5, 50, 'the lowest ratio'),
    ratioMaxX10: whole(5, 50, 'the highest ratio'),
    lowStockG: whole(0, 100_000, 'the low-stock weight'),
  })
  .refine((s) => s.timeMaxS > s.timeMinS, { message: 'The longest time must be over the shortest', path: ['timeMaxS'] })
  .refine((s) => s.ratioMaxX10 > s.ratioMinX10, { message: 'The highest ratio must be over the lowest', path: ['ratioMaxX10'] });
export type BeanSettingsBody = z.infer<typeof beanSettingsBody>;

const grams = (max: number, what: string) => z.number(`Enter the ${what} in grams`).positive(`Enter the ${what} in grams`).max(max, `At most ${max} g`);

/** A test shot: POST /api/dial-in/shots. Grams and seconds as weighed and timed (one decimal kept). */
export const dialInShotBody = z.object({
  lotId: z.number('Choose the lot').int().positive('Choose the lot'),
  grind: text(12, 'Enter the grind setting'),
  doseG: grams(40, 'dose'),
  yieldG: grams(200, 'yield'),
  timeS: z.number('Enter the shot time in seconds').positive('Enter the shot time in seconds').max(120, 'At most 120 s'),
  tasteNote: optionalText(140),
});
export type DialInShotBody = z.infer<typeof dialInShotBody>;

// ------------------------------------------------------------------ answers

/** GET /api/beans. */
export interface BeansView {
  today: string;
  now: string;
  timeZone: string;
  locale: string;
  settings: BeanSettingsView;
  lots: BeanLotView[];
}

/** GET /api/dial-in. */
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

/** POST /api/dial-in/shots. */
export interface LoggedShot {
  shot: DialInShotView;
  advice: ShotAdvice;
  lot: BeanLotView;
}
