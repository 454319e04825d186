// Pricing and paying for one historical order, with the app's own pure functions, so every total
// is exactly what the live Counter would have charged: resolveLine per line, discountCents and
// orderTotals per order.
import { discountCents, orderTotals, taxCents, type OrderTotals } from '@/domain/money';
import { resolveLine, type ResolvedLine } from '@/domain/order-lines';
import type { DiscountInput, OrderLineInput } from '@/domain/schemas';
import type { MenuView } from '@/domain/types';
import type { Random } from './random';

export interface Priced {
  lines: ResolvedLine[];
  totals: OrderTotals;
  discount: DiscountInput | null;
}

/** A lead's discount, given on about one order in twenty. */
function leadDiscount(random: Random, lines: ResolvedLine[]): DiscountInput | null {
  if (!random.chance(0.05)) return null;
  const cheapestDrink = Math.min(...lines.filter((l) => l.station === 'bar').map((l) => l.priceCents));
  const choices: [DiscountInput, number][] = [
    [{ kind: 'percent', value: 10, reason: 'Regular: 10 % off' }, 35],
    [{ kind: 'percent', value: 50, reason: 'Staff drink' }, 20],
    [{ kind: 'percent', value: 20, reason: 'Neighbouring shop: 20 % off' }, 15],
    [{ kind: 'amount', value: 100, reason: 'The wait ran long: $1 off' }, 15],
  ];
  if (Number.isFinite(cheapestDrink)) {
    choices.push([{ kind: 'amount', value: cheapestDrink, reason: 'Loyalty card: tenth drink free' }, 15]);
  }
  return random.weighted(choices);
}

export function priceOrder(menu: MenuView, inputs: OrderLineInput[], random: Random): Priced {
  const lines = inputs.map((input) => {
    const r = resolveLine(menu, input);
    if (!r.ok) throw new Error(`History made a line the menu refuses: ${r.problem.message}`);
    return r.line;
  });
  const lineCents = lines.map((l) => l.priceCents);
  const discount = leadDiscount(random, lines);
  const subtotal = lineCents.reduce((a, b) => a + b, 0);
  const totals = orderTotals(lineCents, menu.location, discountCents(subtotal, discount ?? undefined));
  return { lines, totals, discount };
}

export type Payment = { method: 'card'; providerId: string } | { method: 'cash'; tenderedCents: number; changeCents: number };

const ALNUM = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789';
export const fakeId = (prefix: string, random: Random, length = 20) =>
  prefix + Array.from({ length }, () => ALNUM[Math.floor(random.next() * ALNUM.length)]).join('');

const roundUpTo = (cents: number, step: number) => Math.ceil(cents / step) * step;

/** What a customer hands over: exact change, the next dollar, or a note that covers it. */
function tendered(total: number, random: Random): number {
  const notes = [500, 1000, 2000, 5000].filter((n) => n >= total);
  const options: [number, number][] = [
    [total, 20],
    [roundUpTo(total, 100), 25],
    [roundUpTo(total, 500), 20],
  ];
  if (notes[0] !== undefined) options.push([notes[0], 15]);
  if (notes[1] !== undefined) options.push([notes[1], 20]);
  return Math.max(total, random.weighted(options));
}

/** About 65 % card, 35 % cash; the card service takes nothing under 50 cents, so that is cash. */
export function payment(totalCents: number, random: Random): Payment {
  if (totalCents >= 50 && random.chance(0.65)) return { method: 'card', providerId: fakeId('pi_hist_', random) };
  const t = tendered(totalCents, random);
  return { method: 'cash', tenderedCents: t, changeCents: t - totalCents };
}

const REFUND_REASONS = [
  'Wrong milk; remade and refunded',
  'Customer left before collecting',
  'Drink spilled at the pass',
  'Charged twice for a pastry',
  'Too cold; customer asked for money back',
];

export interface RefundPlan {
  amountCents: number;
  reason: string;
}

/** About one order in two hundred gets money back: in full, or one line with its tax. */
export function refund(priced: Priced, taxRateMilliPct: number, taxMode: 'exclusive' | 'inclusive', random: Random): RefundPlan | null {
  const total = priced.totals.totalCents;
  if (total <= 0 || !random.chance(0.005)) return null;
  const reason = random.pick(REFUND_REASONS);
  if (priced.lines.length === 1 || random.chance(0.5)) return { amountCents: total, reason };
  const line = random.pick(priced.lines).priceCents;
  const withTax = taxMode === 'exclusive' ? line + taxCents(line, taxRateMilliPct, taxMode) : line;
  return { amountCents: Math.min(total, withTax), reason };
}
