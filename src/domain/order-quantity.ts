// Many of one drink. The Counter keeps identical lines as one line with a quantity; the order
// carries the quantity to the server, which expands it into one drink per cup (the Bar makes and
// bumps cups, not lines); the receipt groups identical cups back into "3 × Long black".
import { resolveLine } from './order-lines';
import { plural } from './plural';
import type { OrderLineInput } from './schemas';
import type { MenuView, OrderLineView } from './types';

/** The most cups one line may hold, and one order in all (a large office run fits). */
export const MAX_QUANTITY = 50;
export const MAX_CUPS = 100;

export const quantityOf = (line: { quantity?: number }) => line.quantity ?? 1;

/** Cups in an order: each line counted by its quantity. */
export const cupsOf = (lines: readonly { quantity?: number }[]) => lines.reduce((n, l) => n + quantityOf(l), 0);

/** One entry per cup, in line order. */
export function expandByQuantity<L extends { quantity?: number }, T>(lines: readonly L[], each: (line: L, index: number) => T): T[] {
  return lines.flatMap((l, i) => Array.from({ length: quantityOf(l) }, () => each(l, i)));
}

/** What the drink is once the menu's defaults are filled in: two lines with one key are the same drink. */
function lineKey(menu: MenuView, line: OrderLineInput): string {
  const r = resolveLine(menu, line);
  if (!r.ok) return JSON.stringify({ ...line, quantity: undefined });
  const l = r.line;
  return JSON.stringify([l.menuItemId, l.size?.id ?? null, l.milk?.id ?? null, l.shots, l.extras.map((m) => m.id).sort((a, b) => a - b), l.note ?? '']);
}

/** Add a line to the order: one more on an identical line (up to MAX_QUANTITY), else a new line. */
export function addLine(menu: MenuView, items: readonly OrderLineInput[], line: OrderLineInput): OrderLineInput[] {
  const key = lineKey(menu, line);
  const at = items.findIndex((l) => lineKey(menu, l) === key);
  if (at < 0) return [...items, line];
  return items.map((l, i) => (i === at ? { ...l, quantity: Math.min(MAX_QUANTITY, quantityOf(l) + quantityOf(line)) } : l));
}

export interface LineGroup {
  line: OrderLineView;
  quantity: number;
  totalCents: number;
}

/** Stored cups back into lines for a receipt: identical cups become one "n ×" line where the first stood. */
export function groupOrderLines(lines: readonly OrderLineView[]): LineGroup[] {
  const groups = new Map<string, LineGroup>();
  for (const l of lines) {
    // a refunded drink or a remake is told apart from its identical neighbours
    const key = JSON.stringify([
      l.menuItemId,
      l.itemName,
      l.sizeName,
      l.milkName,
      l.shots,
      l.extras,
      l.note,
      l.priceCents,
      !!l.refundedAt,
      l.remake?.reason ?? null,
    ]);
    const g = groups.get(key);
    if (g) {
      g.quantity += 1;
      g.totalCents += l.priceCents;
    } else groups.set(key, { line: l, quantity: 1, totalCents: l.priceCents });
  }
  return [...groups.values()];
}

/** "3 drinks", "1 drink, 2 items": bar drinks and other items counted apart, by cup. */
export function orderCountLabel(menu: MenuView, items: readonly OrderLineInput[]): string {
  let drinks = 0;
  let others = 0;
  for (const l of items) {
    const station = menu.items.find((i) => i.id === l.menuItemId)?.station;
    if (station === 'bar') drinks += quantityOf(l);
    else others += quantityOf(l);
  }
  const parts = [drinks > 0 ? plural(drinks, 'drink') : null, others > 0 ? plural(others, 'item') : null].filter(Boolean);
  return parts.length ? parts.join(', ') : 'empty';
}
