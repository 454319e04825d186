// Tips: what a suggested percentage gives, and how much a tip may be. Pure, shared by the
// Counter (the buttons show the amount each gives) and the server (which checks the amount sent).
//
// The percentage is taken on the order's total as the customer sees it on the screen: after the
// discount and with the tax in it. One base whatever the café's tax mode (with tax-inclusive prices
// there is no pre-tax figure on the screen to take it from), and the figure the customer is asked
// to tip on is the one in front of them. A tip is never taxed and never discounted itself: it sits
// outside the order's total, and the customer pays total + tip.
import { divideHalfUp } from './money';

/** Suggested percentages: whole percents, 1–50, at most three. */
export const TIP_PERCENT = { min: 1, max: 50 } as const;
export const TIP_SUGGESTIONS_MAX = 3;
/** A tip is at most the order's total, or this much on a small order (a mistyped tip is caught). */
export const TIP_FLOOR_CAP_CENTS = 20_00;
/** The request's own bound, whatever the order. */
export const TIP_MAX_CENTS = 1_000_00;

export interface TipSettings {
  on: boolean;
  /** suggested whole percents, in the order the owner set them */
  percents: number[];
  /** the customer may name an amount of their own */
  custom: boolean;
}

export const TIPS_OFF: TipSettings = { on: false, percents: [], custom: false };

/** The tip a percentage gives on the order's total (after discount, with tax), half up to the cent. */
export function tipForPercent(totalCents: number, percent: number): number {
  return divideHalfUp(totalCents * percent, 100);
}

/** The most a tip may be on an order of this total. */
export function maxTipCents(totalCents: number): number {
  return Math.max(totalCents, TIP_FLOOR_CAP_CENTS);
}

/** What the customer pays: the order's total and the tip on top. */
export const amountDueCents = (totalCents: number, tipCents: number) => totalCents + tipCents;

/**
 * How a refund splits: the order's money first, then the tip (a partial refund is for something
 * wrong with the order; only what goes past the order's total gives the tip back). `refundedCents`
 * is everything given back so far.
 */
export function refundSplit(totalCents: number, refundedCents: number): { orderCents: number; tipCents: number } {
  const orderCents = Math.min(refundedCents, totalCents);
  return { orderCents, tipCents: refundedCents - orderCents };
}
