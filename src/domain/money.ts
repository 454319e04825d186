// Integer-cent arithmetic and tax rounding.

/**
 * Divide and round half up, in integers only (floating point turns 0.115 into 0.11499…).
 * Non-negative inputs only.
 */
export function divideHalfUp(numerator: number, denominator: number): number {
  if (numerator < 0 || denominator <= 0) throw new RangeError('divideHalfUp takes n ≥ 0, d > 0');
  return Math.floor((2 * numerator + denominator) / (2 * denominator));
}

const MILLI_PCT = 100_000; // 100 % in thousandths of a percent

/**
 * Tax on an invoice amount, rounded half up to the cent (the Streamlined Sales and Use Tax
 * Agreement §324 rounding rule, applied per invoice).
 * `exclusive`: tax added on top of the amount. `inclusive`: the tax part already inside it.
 */
export function taxCents(amountCents: number, rateMilliPct: number, mode: 'exclusive' | 'inclusive'): number {
  if (mode === 'exclusive') return divideHalfUp(amountCents * rateMilliPct, MILLI_PCT);
  return divideHalfUp(amountCents * rateMilliPct, MILLI_PCT + rateMilliPct);
}

export interface OrderTotals {
  subtotalCents: number;
  discountCents: number;
  taxCents: number;
  totalCents: number;
}

export function orderTotals(lineCents: number[], location: { taxRateMilliPct: number; taxMode: 'exclusive' | 'inclusive' }, discountCents = 0): OrderTotals {
  const subtotalCents = lineCents.reduce((a, b) => a + b, 0);
  const discount = Math.min(Math.max(0, discountCents), subtotalCents); // never more than the order
  const taxable = subtotalCents - discount;
  const tax = taxCents(taxable, location.taxRateMilliPct, location.taxMode);
  const totalCents = location.taxMode === 'exclusive' ? taxable + tax : taxable;
  return { subtotalCents, discountCents: discount, taxCents: tax, totalCents };
}

export function formatCents(cents: number, currency = 'USD', locale = 'en-US'): string {
  return new Intl.NumberFormat(locale, { style: 'currency', currency }).format(cents / 100);
}

/** The currency's sign for a field label: "$" for USD, "€" for EUR, "CHF" where there is no sign. */
export function currencySymbol(currency = 'USD', locale = 'en-US'): string {
  const parts = new Intl.NumberFormat(locale, { style: 'currency', currency }).formatToParts(0);
  return parts.find((p) => p.type === 'currency')?.value ?? currency;
}

/** "20", "20.5", "$20.50" → 2050 cents; null when it isn't an amount. */
export function parseAmountToCents(text: string): number | null {
  const m = /^\s*\$?\s*(\d{1,6})(?:[.,](\d{1,2}))?\s*$/.exec(text);
  if (!m) return null;
  return Number(m[1]) * 100 + Number((m[2] ?? '0').padEnd(2, '0'));
}

/** Quick cash buttons: the usual notes that cover the total, smallest first. */
export function cashQuickAmounts(totalCents: number, notes = [500, 1000, 2000, 5000, 10000]): number[] {
  return notes.filter((n) => n >= totalCents).slice(0, 3);
}

/** A discount in cents: a whole percent of the subtotal (half up) or a fixed amount. */
export function discountCents(subtotalCents: number, d: { kind: 'percent' | 'amount'; value: number } | undefined): number {
  if (!d) return 0;
  const raw = d.kind === 'percent' ? divideHalfUp(subtotalCents * Math.min(100, d.value), 100) : d.value;
  return Math.min(raw, subtotalCents);
}
