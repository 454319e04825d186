// Recipe units as the menu editor shows them. The database keeps grams in tenths (dose_dg,
// yield_dg) so that 18.5 g is the integer 185 and sums never drift; people read grams.

/** "18", "18.5", "18,5", "18 g" → 180 / 185 tenths of a gram; "" → 0; null when it isn't grams. */
export function parseGramsToDg(text: string): number | null {
  const t = text.trim();
  if (t === '') return 0;
  const m = /^(\d{1,4})(?:[.,](\d))?\s*(?:g)?$/i.exec(t);
  if (!m) return null;
  return Number(m[1]) * 10 + Number(m[2] ?? '0');
}

/** 185 → "18.5", 180 → "18": what the form's field shows. */
export function dgToGramsText(dg: number): string {
  return dg % 10 === 0 ? String(dg / 10) : (dg / 10).toFixed(1);
}

/** A whole number typed in a field ("240", " 2 ") or null; "" → 0. */
export function parseWhole(text: string): number | null {
  const t = text.trim();
  if (t === '') return 0;
  return /^\d{1,6}$/.test(t) ? Number(t) : null;
}

/** 560 → "5.60" for a price field (the currency sign is beside the field). */
export function centsToAmountText(cents: number): string {
  return `${Math.floor(cents / 100)}.${String(cents % 100).padStart(2, '0')}`;
}
