// What the Counter knows about paying for the order being built, apart from its lines.
import { discountCents, orderTotals, parseAmountToCents, type OrderTotals } from '@/domain/money';
import { resolveLine } from '@/domain/order-lines';
import { expandByQuantity } from '@/domain/order-quantity';
import type { DiscountInput, OrderLineInput } from '@/domain/schemas';
import { allergyClash } from '@/domain/allergens';
import { tipForPercent } from '@/domain/tips';
import type { MenuView } from '@/domain/types';

export interface Checkout {
  method: 'cash' | 'card';
  /** Cash tendered as typed; blank means exact. */
  tendered: string;
  paymentMethod: string | null;
  email: string;
  discount: DiscountInput | null;
  /** The cashier checked with the customer that a drink containing their allergen is wanted. */
  clashConfirmed: boolean;
  /** The customer's tip, when the café takes tips: none, a suggested percentage, or an amount as typed. */
  tip: TipChoice;
}

export type TipChoice = { kind: 'none' } | { kind: 'percent'; percent: number } | { kind: 'custom'; text: string };

export const emptyCheckout: Checkout = {
  method: 'cash',
  tendered: '',
  paymentMethod: null,
  email: '',
  discount: null,
  clashConfirmed: false,
  tip: { kind: 'none' },
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
