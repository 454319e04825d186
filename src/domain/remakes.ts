// One drink of a paid order: its own money back (a drink refund), or made again at no charge (a
// remake), and what remakes cost the café. Pure functions; the services are
// server/orders/drink-refunds.ts and server/orders/remakes.ts.
import { divideHalfUp } from './money';

/**
 * Why a drink is made again. A café wants to know what went wrong at the bar (made wrong, not
 * right in the cup) apart from accidents (spilled or dropped), so its waste report says which to
 * work on (common practice: cafés log waste by cause). A customer who wants another drink instead
 * is a new order, not a remake: a remake is the same drink again.
 */
export const REMAKE_REASONS = ['made_wrong', 'spilled', 'not_right', 'other'] as const;
export type RemakeReason = (typeof REMAKE_REASONS)[number];

export const REMAKE_REASON_LABELS: Record<RemakeReason, string> = {
  made_wrong: 'Made wrong (not what was ordered)',
  spilled: 'Spilled or dropped',
  not_right: 'Not right in the cup (temperature, taste, milk)',
  other: 'Other (say in the note)',
};

/** Short words for a card or a report row. */
export const REMAKE_REASON_SHORT: Record<RemakeReason, string> = {
  made_wrong: 'Made wrong',
  spilled: 'Spilled',
  not_right: 'Not right',
  other: 'Other',
};

/** The remake a drink carries on the Bar and in the ticket views. */
export interface RemakeMark {
  /** the drink this one replaces */
  of: number;
  reason: RemakeReason;
  note: string | null;
}

/**
 * A drink's own money back: its share of the order's total, in proportion to its line price.
 *
 * The order's total is the lines less the discount, plus tax worked out once per invoice and
 * rounded half up (orderTotals in money.ts). A drink's share of the discount and of the tax is
 * therefore its price's share of the subtotal; taking it as the difference of two half-up shares
 * — what the drinks still standing are worth, less what they are worth without this one — keeps
 * every cent accounted for: refunding each drink in turn, in any order, gives back exactly the
 * total, never a cent more or less. The tip is not part of any drink (it is the staff's, given
 * back only past the total: src/domain/tips.ts). The stored total is used, not the café's tax
 * rate today, so a rate changed since the sale does not change what the customer gets back.
 *
 * `standingCents`: the line prices of the order's lines not yet refunded as drinks, this one
 * included (remakes, at no charge, add nothing).
 */
export function drinkRefundCents(order: { subtotalCents: number; totalCents: number }, standingCents: number, drinkCents: number): number {
  if (order.subtotalCents <= 0 || drinkCents <= 0) return 0;
  const share = (cents: number) => divideHalfUp(order.totalCents * Math.max(0, cents), order.subtotalCents);
  return share(standingCents) - share(standingCents - drinkCents);
}

/** The lines the customer bought: a remake is the same drink again at no charge, so a receipt or a
 * mail lists the drink once. */
export const soldLines = <L extends { remake: RemakeMark | null }>(lines: readonly L[]): L[] => lines.filter((l) => !l.remake);

/** One row of the waste remakes caused: per reason, how many and what went in the bin. */
export interface RemakeWasteRow {
  reason: RemakeReason;
  count: number;
  /** ground coffee of the drinks thrown away, in 0.1 g */
  doseDg: number;
  /** cold milk those drinks took, in ml */
  milkMl: number;
}

export interface RemakeWaste {
  count: number;
  doseDg: number;
  milkMl: number;
  /** in REMAKE_REASONS order, reasons with none left out */
  byReason: RemakeWasteRow[];
}

export const noRemakeWaste = (): RemakeWaste => ({ count: 0, doseDg: 0, milkMl: 0, byReason: [] });

/** Sum rows (one per reason, or several per reason from several days) into the report's figure. */
export function remakeWaste(rows: RemakeWasteRow[]): RemakeWaste {
  const by = new Map<RemakeReason, RemakeWasteRow>();
  for (const r of rows) {
    const row = by.get(r.reason) ?? { reason: r.reason, count: 0, doseDg: 0, milkMl: 0 };
    row.count += r.count;
    row.doseDg += r.doseDg;
    row.milkMl += r.milkMl;
    by.set(r.reason, row);
  }
  const byReason = REMAKE_REASONS.flatMap((reason) => {
    const row = by.get(reason);
    return row && row.count > 0 ? [row] : [];
  });
  return {
    count: byReason.reduce((a, r) => a + r.count, 0),
    doseDg: byReason.reduce((a, r) => a + r.doseDg, 0),
    milkMl: byReason.reduce((a, r) => a + r.milkMl, 0),
    byReason,
  };
}
