// The order being built: its lines (tap to edit, − / + or type how many, ✕ to remove) and the
// running totals. Identical drinks are one line with a quantity ("3 × Long black").
import { useState } from 'react';
import { formatCents, type OrderTotals } from '@/domain/money';
import { resolveLine } from '@/domain/order-lines';
import { MAX_QUANTITY, orderCountLabel, quantityOf } from '@/domain/order-quantity';
import type { OrderLineInput } from '@/domain/schemas';
import type { MenuView } from '@/domain/types';
import { cupSizeLabel } from '@/domain/units';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';

interface Props {
  menu: MenuView;
  items: OrderLineInput[];
  totals: OrderTotals;
  error?: string;
  onEditLine(index: number): void;
  /** Below 1 removes the line. */
  onQuantity(index: number, quantity: number): void;
  onRemoveLine(index: number): void;
}

export function OrderPanel({ menu, items, totals, error, onEditLine, onQuantity, onRemoveLine }: Props) {
  const money = (c: number) => formatCents(c, menu.location.currency);
  const priced = items.map((l) => resolveLine(menu, l));
  // A size is named only where the item comes in several ("Latte · Large · 16 oz"): an item sold
  // in one size has nothing to tell apart, whatever that size is called.
  const sizeCount = (itemId: number) => menu.items.find((m) => m.id === itemId)?.sizes.length ?? 0;
  return (
    <section aria-label="Order">
      <h2 className="text-2xl font-semibold">Order{items.length > 0 ? ` · ${orderCountLabel(menu, items)}` : ''}</h2>
      <ol className="mt-1 divide-y divide-steam-200" aria-label="Order lines">
        {items.length === 0 && <li className="py-4 text-center text-lg text-ink-600">Tap an item to start</li>}
        {priced.map((p, i) => {
          const quantity = quantityOf(items[i]);
          return p.ok ? (
            <li key={i} className="py-2" data-testid="order-line">
              <div className="flex items-start gap-2">
                <button type="button" className="min-w-0 flex-1 text-left" onClick={() => onEditLine(i)}>
                  <span className="block text-lg font-semibold">
                    {quantity > 1 && <span>{quantity} × </span>}
                    {p.line.itemName}
                    {p.line.size && sizeCount(p.line.menuItemId) > 1
                      ? ` · ${p.line.size.name} · ${cupSizeLabel(p.line.size.volumeMl, menu.location.volumeUnit ?? 'ml')}`
                      : ''}
                  </span>
                </button>
                <span className="text-lg font-semibold whitespace-nowrap">{money(p.line.priceCents * quantity)}</span>
              </div>
              <div className="flex items-center gap-2">
                <button type="button" className="min-w-0 flex-1 text-left text-base text-ink-600" tabIndex={-1} onClick={() => onEditLine(i)}>
                  {[
                    p.line.milk?.name,
                    p.line.shots ? `${p.line.shots} shot${p.line.shots === 1 ? '' : 's'}` : null,
                    ...p.line.extras.map((m) => m.name),
                    p.line.note,
                  ]
                    .filter(Boolean)
                    .join(' · ')}
                </button>
                <QuantityStepper name={p.line.itemName} quantity={quantity} onChange={(q) => onQuantity(i, q)} />
                <Button tone="quiet" aria-label={`Remove ${p.line.itemName}`} onClick={() => onRemoveLine(i)}>
                  ✕
                </Button>
              </div>
            </li>
          ) : (
            <li key={i} className="py-2 font-semibold text-copper-700">
              <span aria-hidden>⊘ </span>
              {quantity > 1 ? `${quantity} × ` : ''}
              {p.problem.message}
              <Button tone="quiet" className="ml-2" onClick={() => onRemoveLine(i)}>
                Remove
              </Button>
            </li>
          );
        })}
      </ol>
      <FieldError message={error} />
      <dl className="mt-2 grid grid-cols-2 gap-y-0.5 border-t border-steam-200 pt-2 text-lg">
        <dt>Subtotal</dt>
        <dd className="text-right">{money(totals.subtotalCents)}</dd>
        {totals.discountCents > 0 && (
          <>
            <dt>Discount</dt>
            <dd className="text-right">−{money(totals.discountCents)}</dd>
          </>
        )}
        <dt>Tax{menu.location.taxMode === 'inclusive' ? ' (included)' : ''}</dt>
        <dd className="text-right">{money(totals.taxCents)}</dd>
        <dt className="text-2xl font-semibold">Total</dt>
        <dd data-testid="order-total" className="text-right text-2xl font-semibold">
          {money(totals.totalCents)}
        </dd>
      </dl>
    </section>
  );
}

/** − / + for one more or fewer, and the number itself to type (31 long blacks in one go). */
function QuantityStepper({ name, quantity, onChange }: { name: string; quantity: number; onChange(q: number): void }) {
  const [typed, setTyped] = useState<string | null>(null);
  return (
    <div className="flex shrink-0 items-center gap-1">
      <Button tone="quiet" className="min-w-11 px-2 text-xl" aria-label={`One fewer ${name}`} onClick={() => onChange(quantity - 1)}>
        −
      </Button>
      <input
        type="number"
        inputMode="numeric"
        min={1}
        max={MAX_QUANTITY}
        aria-label={`How many ${name}`}
        className="h-11 w-14 rounded-lg border border-steam-200 text-center text-lg font-semibold"
        value={typed ?? String(quantity)}
        onChange={(e) => {
          setTyped(e.target.value);
          const n = Number(e.target.value);
          if (Number.isInteger(n) && n >= 1 && n <= MAX_QUANTITY) onChange(n);
        }}
        onBlur={() => setTyped(null)}
        onFocus={(e) => e.target.select()}
      />
      <Button
        tone="quiet"
        className="min-w-11 px-2 text-xl"
        aria-label={`One more ${name}`}
        disabled={quantity >= MAX_QUANTITY}
        onClick={() => onChange(quantity + 1)}
      >
        +
      </Button>
    </div>
  );
}
