// A shot's numbers as the bar says them: "2.4 · 18.0 g → 36.0 g · 28 s · 1:2.0".
import { formatGrams, formatSeconds, type DialInShotView, type ShotWindow } from '@/domain/dial-in';
import { keepUnits } from '@/lib/keep-units';
import { formatRatio } from '@/domain/format';

export function shotNumbers(s: Pick<DialInShotView, 'doseDg' | 'yieldDg' | 'timeDs' | 'ratioX10'>) {
  return keepUnits(`${formatGrams(s.doseDg)} → ${formatGrams(s.yieldDg)} · ${formatSeconds(s.timeDs)} · ${formatRatio(s.ratioX10)}`);
}

export const timeOfDay = (iso: string, timeZone: string, locale = 'en-US') =>
  new Intl.DateTimeFormat(locale, { hour: 'numeric', minute: '2-digit', timeZone }).format(new Date(iso));

/** 180 → "18", 185 → "18.5": grams as the bar says them. */
const grams = (dg: number) => (dg % 10 === 0 ? String(dg / 10) : (dg / 10).toFixed(1));

/**
 * The café's window in bar words: "A good shot here: 18 g in, 32–40 g out in 25–30 s". The yield is
 * the ratio applied to the house recipe's dose (or the middle of the dose range), to the whole gram.
 */
export function goodShotWords(w: ShotWindow, recipeDoseDg: number | null): string {
  const dose = recipeDoseDg ?? Math.round((w.doseMinDg + w.doseMaxDg) / 2);
  const doseText = recipeDoseDg ? `${grams(recipeDoseDg)} g` : `${grams(w.doseMinDg)}–${grams(w.doseMaxDg)} g`;
  const yieldMin = Math.round((dose * w.ratioMinX10) / 100);
  const yieldMax = Math.round((dose * w.ratioMaxX10) / 100);
  const yieldText = yieldMin === yieldMax ? `${yieldMin}` : `${yieldMin}–${yieldMax}`;
  return `A good shot here: ${doseText} in, ${yieldText} g out in ${w.timeMinS}–${w.timeMaxS} s — the café's own target`;
}
