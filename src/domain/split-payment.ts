// Split payment: one order paid in parts — some in cash at the till, the rest on one card or two.
// Pure, shared by the Counter (what is still to cover) and the server (what the order's columns
// say once every part is paid, and which parts a refund gives back).
//
// A part is numbered by its place in the list (1, 2, …); an order paid at once has one part, number 1.
// The order goes to the bar only when its parts add up to everything due (total and tip).

/** Parts on one order: enough for two friends, a gift card's worth of cash and a card, or four people. */
export const SPLIT_PARTS_MAX = 4;

export type PartMethod = 'cash' | 'card';

/** A part that was paid: its payment row, and what has been given back of it. */
export interface PaidPart {
  paymentId: number;
  part: number;
  method: PartMethod;
  amountCents: number;
  tenderedCents: number | null;
  changeCents: number | null;
  refundedCents: number;
}

/** What the listed parts add up to, less what is due: 0 when they match. */
export function splitDifference(parts: readonly { amountCents: number }[], dueCents: number): number {
  return parts.reduce((sum, p) => sum + p.amountCents, 0) - dueCents;
}

/** What the last part must be for the list to cover the amount due (never below 0). */
export function remainderCents(earlier: readonly { amountCents: number }[], dueCents: number): number {
  return Math.max(0, dueCents - earlier.reduce((sum, p) => sum + p.amountCents, 0));
}

const sumOrNull = (values: number[]) => (values.length ? values.reduce((a, b) => a + b, 0) : null);

/**
 * How the order reads once paid: the method of its one part, or `split` with the cash it took. The
 * tendered and change figures are the cash parts' own, added up (what the cashier took and gave).
 */
export function paidColumns(paid: readonly Pick<PaidPart, 'method' | 'amountCents' | 'tenderedCents' | 'changeCents'>[]) {
  const cash = paid.filter((p) => p.method === 'cash');
  return {
    payment_method: paid.length === 1 ? paid[0].method : ('split' as const),
    tendered_cents: sumOrNull(cash.map((p) => p.tenderedCents ?? p.amountCents)),
    change_cents: sumOrNull(cash.map((p) => p.changeCents ?? 0)),
    split_cash_cents: paid.length === 1 ? null : cash.reduce((sum, p) => sum + p.amountCents, 0),
  };
}

/**
 * Which parts give back `amountCents`: the last paid first, each part at most what is left of it
 * (one refund of the whole order gives every part back). A refund that names its part is that
 * part's alone; the caller checks it against that part.
 */
export function refundPlan(paid: readonly Pick<PaidPart, 'paymentId' | 'part' | 'amountCents' | 'refundedCents'>[], amountCents: number) {
  let left = amountCents;
  const plan: { paymentId: number; amountCents: number }[] = [];
  for (const p of [...paid].sort((a, b) => b.part - a.part)) {
    const take = Math.min(left, p.amountCents - p.refundedCents);
    if (take > 0) plan.push({ paymentId: p.paymentId, amountCents: take });
    left -= take;
    if (left === 0) break;
  }
  if (left > 0) throw new RangeError('More than the parts hold');
  return plan;
}

/** A split's parts as a receipt says them: "Part 1 · cash $5.00 (tendered $10.00, change $5.00)". */
export function partLines(parts: readonly Omit<PaidPart, 'paymentId' | 'refundedCents'>[], money: (cents: number) => string): string[] {
  return parts.map((p) => {
    const cash = p.method === 'cash' && p.tenderedCents !== null ? ` (tendered ${money(p.tenderedCents)}, change ${money(p.changeCents ?? 0)})` : '';
    return `Part ${p.part} · ${p.method} ${money(p.amountCents)}${cash}`;
  });
}
