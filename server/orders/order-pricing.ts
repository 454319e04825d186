// Check an order against the menu and price it: every line, the discount, the tax, the allergens.
import { allergensOf } from '@/domain/allergens';
import { discountCents, orderTotals, type OrderTotals } from '@/domain/money';
import { amountDueCents, maxTipCents, TIPS_OFF } from '@/domain/tips';
import { resolveLine, type ResolvedLine } from '@/domain/order-lines';
import { expandByQuantity } from '@/domain/order-quantity';
import { can } from '@/domain/roles';
import type { CreateOrderBody } from '@/domain/schemas';
import type { MenuView, SessionUser } from '@/domain/types';
import { conflict, fieldsNeedFixing, forbidden } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { currentMenu } from '@server/menu/menu-cache';
import { requireEnoughCash } from './settle';

export interface PricedOrder {
  menu: MenuView;
  lines: ResolvedLine[];
  totals: OrderTotals;
  /** the customer's tip, outside the totals: they pay totals.totalCents + tipCents */
  tipCents: number;
}

const fieldNeedsFixing = (path: string, message: string) => fieldsNeedFixing([{ path, message }]);

export async function priceOrder(deps: Deps, user: SessionUser, body: CreateOrderBody): Promise<PricedOrder> {
  const menu = await currentMenu(deps.db, user.locationId);
  const resolved = body.items.map((input, i) => {
    const r = resolveLine(menu, input);
    if (r.ok) return r.line;
    const details = [{ path: `items.${i}.${r.problem.field}`, message: r.problem.message }];
    if (r.problem.kind === 'unavailable') throw conflict(r.problem.message, details, 'unavailable');
    throw fieldsNeedFixing(details);
  });
  // "3 × Long black" is three cups: one drink each for the Bar, one stored line each.
  const lines = expandByQuantity(body.items, (_, i) => resolved[i]);

  const known = allergensOf(menu.location.allergenList);
  body.allergens.forEach((a, i) => {
    if (!known.includes(a)) throw fieldNeedsFixing(`allergens.${i}`, `"${a}" is not on this café's allergen list`);
  });

  if (body.discount && !can(user.role, 'giveDiscounts')) {
    throw forbidden('Only a shift lead or the owner can give a discount');
  }
  const lineCents = lines.map((l) => l.priceCents);
  const subtotal = lineCents.reduce((a, b) => a + b, 0);
  const totals = orderTotals(lineCents, menu.location, discountCents(subtotal, body.discount));

  // The provider's smallest card charge in US dollars is 50 cents (from memory of its docs).
  if (body.payment.method === 'card' && totals.totalCents < 50) {
    throw fieldNeedsFixing('payment.method', 'Card payments start at 50 cents; take this one as cash');
  }
  // Tax and discount above are on the lines alone: the tip is added after, untouched by either.
  const tipCents = body.tipCents ?? 0;
  const tips = menu.location.tips ?? TIPS_OFF;
  if (tipCents > 0 && !tips.on) throw fieldNeedsFixing('tipCents', 'This café does not take tips');
  if (tipCents > maxTipCents(totals.totalCents)) {
    throw fieldNeedsFixing('tipCents', `A tip is at most ${maxTipCents(totals.totalCents)} cents on this order`);
  }
  if (body.payment.method === 'cash') requireEnoughCash(amountDueCents(totals.totalCents, tipCents), body.payment.tenderedCents);
  return { menu, lines, totals, tipCents };
}
