// How every screen writes a brew ratio, a duration and an ordinal: one formatter each, so the same
// numbers never read two ways on two screens.

/**
 * Brew ratio yield ÷ dose in tenths (1:2.0 is 20), halves rounded up, on whole numbers only:
 * 18 g in and 38.7 g out is 2.15 exactly → 22 (toFixed on the double 2.1499… gave 1:2.1).
 */
export function brewRatioX10(doseDg: number, yieldDg: number): number {
  return Math.floor((20 * yieldDg + doseDg) / (2 * doseDg));
}

/** 22 → "1:2.2". */
export const formatRatio = (ratioX10: number) => `1:${Math.floor(ratioX10 / 10)}.${ratioX10 % 10}`;

/** The ratio of a recipe being typed, or null while it has no dose or no yield. */
export function ratioLabel(doseDg: number, yieldDg: number): string | null {
  if (!(doseDg > 0 && yieldDg > 0)) return null;
  return formatRatio(brewRatioX10(doseDg, yieldDg));
}

/** 272.5 → "4:33", 90 → "1:30" (minutes:seconds, rounded to the second); null or infinite → "—". */
export function formatDuration(seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined || !Number.isFinite(seconds)) return '—';
  const s = Math.round(seconds);
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`;
}

/** A duration inside a sentence: "20 s" under a minute, "1:30" from a minute on — never rounded to "2 min". */
export function durationWords(seconds: number): string {
  const s = Math.round(seconds);
  return s < 60 ? `${s} s` : formatDuration(s);
}

/** 1 → "1st", 12 → "12th", 22 → "22nd": English ordinals, with 11th–13th. */
export function ordinal(n: number): string {
  const teen = n % 100 >= 11 && n % 100 <= 13;
  const suffix = teen ? 'th' : (({ 1: 'st', 2: 'nd', 3: 'rd' } as Record<number, string>)[n % 10] ?? 'th');
  return `${n}${suffix}`;
}
