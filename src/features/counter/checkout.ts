// What the Counter knows about paying for the order being built, apart from its lines.
import { discountCents, orderTotals, parseAmountToCents, type OrderTotals } from '@/domain/money';
import { resolveLine } from '@/domain/order-lines';
import { expandByQuantity } from '@/domain/order-quantity';
import type { DiscountInput, OrderLineInput, PaymentPart } from '@/domain/schemas';
import { remainderCents } from '@/domain/split-payment';
import { allergyClash } from '@/domain/allergens';
import { tipForPercent } from '@/domain/tips';
import type { MenuView } from '@/domain/types';

export interface Checkout {
  method: 'cash' | 'card' | 'split';
  /** Cash tendered as typed; blank means exact. */
  tendered: string;
  paymentMethod: string | null;
  email: string;
  discount: DiscountInput | null;
  /** The cashier checked with the customer that a drink containing their allergen is wanted. */
  clashConfirmed: boolean;
  /** The customer's tip, when the café takes tips: none, a suggested percentage, or an amount as typed. */
  tip: TipChoice;
  /** The parts of a split payment, as typed; the last part's amount is what the others leave. */
  split: SplitPartDraft[];
  /** Parts the server has taken already (after a declined card): shown paid, not editable. */
  paidParts: number[];
}

export interface SplitPartDraft {
  method: 'cash' | 'card';
  /** The part's amount as typed (ignored on the last part). */
  amount: string;
  /** Cash tendered as typed; blank means exact. */
  tendered: string;
  paymentMethod: string | null;
}

export const emptySplitPart = (method: SplitPartDraft['method']): SplitPartDraft => ({ method, amount: '', tendered: '', paymentMethod: null });

export type TipChoice = { kind: 'none' } | { kind: 'percent'; percent: number } | { kind: 'custom'; text: string };

export const emptyCheckout: Checkout = {
  method: 'cash',
  tendered: '',
  paymentMethod: null,
  email: '',
  discount: null,
  clashConfirmed: false,
  tip: { kind: 'none' },
  split: [emptySplitPart('cash'), emptySplitPart('card')],
  paidParts: [],
};

/** The tip in cents on an order of this total (after discount, with tax); null when the typed amount isn't one. */
export function tipCentsOf(tip: TipChoice, totalCents: number): number | null {
  if (tip.kind === 'none') return 0;
  if (tip.kind === 'percent') return tipForPercent(totalCents, tip.percent);
  return tip.text.trim() === '' ? 0 : parseAmountToCents(tip.text);
}

/** "Flat white contains tree nuts (from the almond milk)": each line that contains an allergen the
 * customer avoids, and where in the drink it comes from, so the cashier knows what to swap. */
export function clashesOf(menu: MenuView, items: OrderLineInput[], avoid: string[]): { itemName: string; allergens: string[]; from: string[] }[] {
  return items.flatMap((l) => {
    const r = resolveLine(menu, l);
    if (!r.ok) return [];
    const allergens = allergyClash(r.line.contains, avoid);
    if (!allergens.length) return [];
    const item = menu.items.find((i) => i.id === l.menuItemId);
    const hits = (tags: readonly string[]) => tags.some((t) => allergens.includes(t));
    const from = [
      // a croissant is an item, not a drink
      ...(item && hits(item.allergens) ? [item.station === 'bar' ? 'the drink itself' : 'the item itself'] : []),
      ...(r.line.milk && hits(r.line.milk.allergens) ? [`the ${r.line.milk.name.toLowerCase()} milk`] : []),
      ...r.line.extras.filter((m) => hits(menu.extras.find((x) => x.id === m.id)?.allergens ?? [])).map((m) => m.name.toLowerCase()),
    ];
    return [{ itemName: r.line.itemName, allergens, from }];
  });
}

/** The same pure pricing the server uses, for the running total on screen. */
export function previewTotals(menu: MenuView, items: OrderLineInput[], discount: DiscountInput | null): OrderTotals {
  // one price per cup, as the server expands "3 × Long black"
  const cents = expandByQuantity(items, (l) => {
    const r = resolveLine(menu, l);
    return r.ok ? r.line.priceCents : 0;
  });
  const subtotal = cents.reduce((a, b) => a + b, 0);
  return orderTotals(cents, menu.location, discountCents(subtotal, discount ?? undefined));
}

/** The names of lines that can't be made now (86'd or gone from the menu), once each. */
export function blockedLines(menu: MenuView, items: OrderLineInput[]): string[] {
  const names = items.flatMap((l) => {
    const r = resolveLine(menu, l);
    return r.ok ? [] : [menu.items.find((i) => i.id === l.menuItemId)?.name ?? 'An item no longer on the menu'];
  });
  return [...new Set(names)];
}

/** Tendered cents, the total when blank, null when it isn't an amount. */
export function tenderedCents(checkout: Checkout, totalCents: number): number | null {
  return checkout.tendered.trim() === '' ? totalCents : parseAmountToCents(checkout.tendered);
}

/** Each split part's amount in cents: typed (null when it isn't an amount), the last what the others leave. */
export function splitAmounts(split: SplitPartDraft[], dueCents: number): (number | null)[] {
  const typed = split.slice(0, -1).map((p) => parseAmountToCents(p.amount));
  const earlier = typed.map((c) => ({ amountCents: c ?? 0 }));
  return [...typed, remainderCents(earlier, dueCents)];
}

/**
 * The split as the server takes it, or why it can't go yet (an amount not typed, a part of nothing,
 * cash short of its part, a card not chosen). Each part's problem is said in the cashier's words.
 */
export function splitParts(split: SplitPartDraft[], dueCents: number): { parts: PaymentPart[] } | { problem: string } {
  const amounts = splitAmounts(split, dueCents);
  const parts: PaymentPart[] = [];
  for (const [i, p] of split.entries()) {
    const amountCents = amounts[i];
    const n = i + 1;
    if (amountCents === null) return { problem: `Part ${n}: enter an amount like 5 or 5.50` };
    if (amountCents <= 0) return { problem: i === split.length - 1 ? 'The other parts already cover everything' : `Part ${n}: more than 0, please` };
    if (p.method === 'card') {
      if (!p.paymentMethod) return { problem: `Part ${n}: choose the card` };
      parts.push({ method: 'card', amountCents, paymentMethod: p.paymentMethod });
    } else {
      const tendered = p.tendered.trim() === '' ? amountCents : parseAmountToCents(p.tendered);
      if (tendered === null) return { problem: `Part ${n}: enter the cash like 10 or 10.50` };
      if (tendered < amountCents) return { problem: `Part ${n}: the cash is less than the part` };
      parts.push({ method: 'cash', amountCents, tenderedCents: tendered });
    }
  }
  return { parts };
}
