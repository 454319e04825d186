// The location's settings: the request bodies (shared by the settings forms and the routes),
// the checks of time zone, currency and locale against the runtime's Intl data, and the view
// GET /api/settings answers with.
import { z } from 'zod';
import type { AllergenSwitchPreview } from './allergen-switch';
import type { AllergenList } from './allergens';
import { plainText } from './text';
import { TIP_PERCENT, TIP_SUGGESTIONS_MAX } from './tips';
import { TEMPERATURE_UNITS, VOLUME_UNITS, type TemperatureUnit, type VolumeUnit } from './units';

export const WAIT_TARGET_SECONDS = { min: 60, max: 1800 } as const;
export const PICKUP_TIMEOUT_SECONDS = { min: 60, max: 3600 } as const;
export const PITCHER_CAPACITY_ML = { min: 150, max: 2000 } as const;
export const JUG_WASTE_MAX_ML = 100;
export const JUG_MAX_DRINKS = { min: 1, max: 12 } as const;
export const EXPANSION_MAX_PCT = 200;

/**
 * A new pitcher's minimum fill, the least cold milk that covers the steam tip: about a third of
 * the pitcher (common practice, from memory), rounded up to 10 ml, never above its fill line.
 */
export const defaultMinFillMl = (capacityMl: number, fillLineMl: number) => Math.min(fillLineMl, Math.ceil(capacityMl / 30) * 10);
export const EXTRA_SHOT_MAX_CENTS = 20_00;
export const RECEIPT_FOOTER_MAX = 200;

/** An IANA zone name in its canonical spelling ("us/eastern" → "America/New_York"), or null. */
export function canonicalTimeZone(name: string): string | null {
  // Offsets like "+05:00" are not zones: they never change for daylight saving time.
  if (!/^[A-Za-z][A-Za-z0-9_+\-/]*$/.test(name)) return null;
  try {
    return new Intl.DateTimeFormat('en-US', { timeZone: name }).resolvedOptions().timeZone;
  } catch {
    return null;
  }
}

/** A BCP 47 locale the runtime can format numbers and dates for, canonical ("en-us" → "en-US"). */
export function canonicalLocale(tag: string): string | null {
  try {
    const [canonical] = Intl.getCanonicalLocales(tag);
    return canonical && Intl.NumberFormat.supportedLocalesOf(canonical).length > 0 ? canonical : null;
  } catch {
    return null;
  }
}

/**
 * An ISO 4217 code Intl knows, with two decimal places: Jugline counts money in cents, so a
 * currency with none (JPY) or three (KWD) would be mispriced.
 */
export function currencyProblem(code: string): string | null {
  if (!/^[A-Z]{3}$/.test(code)) return 'Three capital letters, as in USD or EUR';
  const known = typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('currency').includes(code) : true;
  if (!known) return `${code} is not a currency code this system knows`;
  const digits = new Intl.NumberFormat('en-US', { style: 'currency', currency: code }).resolvedOptions().maximumFractionDigits;
  return digits === 2 ? null : `${code} has ${digits} decimal places; Jugline counts money in cents (2 places)`;
}

/** "8.25" → 8250, "8.875" → 8875 thousandths of a percent; null past 3 decimals or 100 %. */
export function percentToMilli(text: string): number | null {
  const m = /^(\d{1,3})(?:\.(\d{1,3}))?$/.exec(text.trim());
  if (!m) return null;
  const milli = Number(m[1]) * 1000 + Number((m[2] ?? '').padEnd(3, '0'));
  return milli <= 100_000 ? milli : null;
}

/** 8250 → "8.25", 8000 → "8", 8875 → "8.875". */
export function milliToPercent(milli: number): string {
  const whole = Math.floor(milli / 1000);
  const frac = String(milli % 1000)
    .padStart(3, '0')
    .replace(/0+$/, '');
  return frac ? `${whole}.${frac}` : String(whole);
}

const custom = (ctx: z.RefinementCtx, message: string) => {
  ctx.addIssue({ code: 'custom', message });
  return z.NEVER;
};

export const cafeNameField = plainText().min(1, 'Enter the café name').max(80, 'At most 80 characters');
export const timeZoneField = plainText()
  .min(1, 'Enter a time zone such as America/New_York')
  .max(64)
  .transform((v, ctx) => canonicalTimeZone(v) ?? custom(ctx, 'Not a time zone name; use one like America/New_York or Europe/Dublin'));
export const localeField = plainText()
  .min(1, 'Enter a locale such as en-US')
  .max(35)
  .transform((v, ctx) => canonicalLocale(v) ?? custom(ctx, 'Not a locale this system can format for; use one like en-US or de-DE'));
export const currencyField = plainText().transform((v, ctx) => {
  const problem = currencyProblem(v);
  return problem ? custom(ctx, problem) : v;
});
/** Percent as typed (a string) or sent as a JSON number: up to 3 decimals, 0–100. */
export const taxRatePercentField = z
  .union([z.string().max(10), z.number().finite()])
  .transform((v, ctx) => percentToMilli(String(v)) ?? custom(ctx, 'A percent from 0 to 100 with up to 3 decimals, like 8.25 or 8.875'));
export const receiptFooterField = plainText()
  .max(RECEIPT_FOOTER_MAX, `At most ${RECEIPT_FOOTER_MAX} characters`)
  .nullable()
  .transform((v) => v || null);

const int = (min: number, max: number, what: string) =>
  z
    .number({ error: `${what}: enter a number` })
    .int(`${what}: a whole number`)
    .min(min, `${what}: at least ${min}`)
    .max(max, `${what}: at most ${max}`);

export const SETTINGS_FIELDS = {
  name: cafeNameField,
  timeZone: timeZoneField,
  currency: currencyField,
  locale: localeField,
  taxMode: z.enum(['exclusive', 'inclusive']),
  taxRatePercent: taxRatePercentField,
  extraShotCents: int(0, EXTRA_SHOT_MAX_CENTS, 'Extra shot price in cents'),
  waitTargetSeconds: int(WAIT_TARGET_SECONDS.min, WAIT_TARGET_SECONDS.max, 'Wait target in seconds'),
  pickupTimeoutSeconds: int(PICKUP_TIMEOUT_SECONDS.min, PICKUP_TIMEOUT_SECONDS.max, 'Pickup timeout in seconds'),
  volumeUnit: z.enum(VOLUME_UNITS),
  temperatureUnit: z.enum(TEMPERATURE_UNITS),
  jugWasteMl: int(0, JUG_WASTE_MAX_ML, 'Milk lost per jug in ml'),
  jugMaxDrinks: int(JUG_MAX_DRINKS.min, JUG_MAX_DRINKS.max, 'Drinks per jug'),
  expansionFlatPct: int(0, EXPANSION_MAX_PCT, 'Flat milk growth in %'),
  expansionSilkyPct: int(0, EXPANSION_MAX_PCT, 'Silky milk growth in %'),
  expansionFoamyPct: int(0, EXPANSION_MAX_PCT, 'Foamy milk growth in %'),
  allergenList: z.enum(['US', 'EU']),
  receiptFooter: receiptFooterField,
  readyMail: z.boolean({ error: 'Ready mail: on or off' }),
  tipsOn: z.boolean({ error: 'Tips: on or off' }),
  tipPercents: z
    .array(int(TIP_PERCENT.min, TIP_PERCENT.max, 'Suggested tip in %'), { error: 'Suggested tips: a list of percents' })
    .max(TIP_SUGGESTIONS_MAX, `At most ${TIP_SUGGESTIONS_MAX} suggested tips`)
    .refine((p) => new Set(p).size === p.length, 'Each suggested tip once'),
  tipCustom: z.boolean({ error: 'Custom tip: allowed or not' }),
};
export type SettingKey = keyof typeof SETTINGS_FIELDS;

/**
 * PUT /api/settings: any of the settings (a form section sends its own), at least one. Switching
 * the allergen list rewrites nothing: the menu's allergens are worked out from its ingredients.
 */
export const settingsBody = z
  .strictObject(SETTINGS_FIELDS)
  .partial()
  .refine((b) => Object.keys(SETTINGS_FIELDS).some((k) => b[k as SettingKey] !== undefined), 'Change at least one setting');
export type SettingsBody = z.infer<typeof settingsBody>;

/** A pitcher; without `minFillMl` the pitcher gets the usual minimum (defaultMinFillMl). */
export const pitcherBody = z
  .strictObject({
    capacityMl: int(PITCHER_CAPACITY_ML.min, PITCHER_CAPACITY_ML.max, 'Capacity in ml'),
    fillLineMl: z.number({ error: 'Fill line in ml: enter a number' }).int('Fill line in ml: a whole number').positive('Fill line: above 0 ml'),
    minFillMl: z
      .number({ error: 'Minimum fill in ml: enter a number' })
      .int('Minimum fill in ml: a whole number')
      .positive('Minimum fill: above 0 ml')
      .optional(),
  })
  .refine((p) => p.fillLineMl <= p.capacityMl, { path: ['fillLineMl'], message: 'The fill line cannot be above the capacity' })
  .refine((p) => p.minFillMl === undefined || p.minFillMl <= p.fillLineMl, { path: ['minFillMl'], message: 'The minimum cannot be above the fill line' });
export type PitcherBody = z.infer<typeof pitcherBody>;

// ---------------------------------------------------------------- the view

export interface SettingsView {
  name: string;
  timeZone: string;
  currency: string;
  locale: string;
  taxMode: 'exclusive' | 'inclusive';
  /** As the owner typed it: "8.25" (stored as 8250 thousandths of a percent). */
  taxRatePercent: string;
  extraShotCents: number;
  waitTargetSeconds: number;
  pickupTimeoutSeconds: number;
  volumeUnit: VolumeUnit;
  temperatureUnit: TemperatureUnit;
  jugWasteMl: number;
  jugMaxDrinks: number;
  expansionFlatPct: number;
  expansionSilkyPct: number;
  expansionFoamyPct: number;
  allergenList: AllergenList;
  receiptFooter: string | null;
  /** Mail a customer who left an address for the receipt when the order is ready. */
  readyMail: boolean;
  /** Tips at the Counter: off (the default), or on with suggested percentages and/or a custom amount. */
  tipsOn: boolean;
  /** suggested whole percents (1–50), at most three, in the order the owner set them */
  tipPercents: number[];
  /** the customer may name a tip of their own */
  tipCustom: boolean;
}

export interface PitcherView {
  id: number;
  capacityMl: number;
  fillLineMl: number;
  minFillMl: number;
}

export interface SettingsPage {
  settings: SettingsView;
  pitchers: PitcherView[];
  /** The cup sizes on the menu now, for the units preview. */
  cupSizes: { volumeMl: number; names: string[] }[];
  /** What switching to the other allergen list would change on the menu, for the owner to read first. */
  allergenSwitch: AllergenSwitchPreview;
}
