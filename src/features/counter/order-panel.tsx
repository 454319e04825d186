// The order being built: its lines (tap to edit, ✕ to remove) and the running totals.
import { formatCents, type OrderTotals } from '../../domain/money';
import { resolveLine } from '../../domain/order-lines';
import type { OrderLineInput } from '../../domain/schemas';
import type { MenuView } from '../../domain/types';
import { cupSizeLabel } from '../../domain/units';
import { Button } from '../../components/ui/button';
import { FieldError } from '../../components/ui/field-error';

interface Props {
  menu: MenuView;
  items: OrderLineInput[];
  totals: OrderTotals;
  error?: string;
  onEditLine(index: number): void;
  onRemoveLine(index: number): void;
}

export function OrderPanel({ menu, items, totals, error, onEditLine, onRemoveLine }: Props) {
  const money = (c: number) => formatCents(c, menu.location.currency);
  const priced = items.map((l) => resolveLine(menu, l));
  // the cup size in the café's unit where the item comes in several ("Latte · Large · 16 oz")
  const sizeCount = (itemId: number) => menu.items.find((m) => m.id === itemId)?.sizes.length ?? 0;
  return (
    <section aria-label="Order">
      <h2 className="text-2xl font-semibold">Order</h2>
      <ol className="mt-1 divide-y divide-steam-200" aria-label="Order lines">
        {items.length === 0 && <li className="py-4 text-center text-lg text-ink-600">Tap an item to start</li>}
        {priced.map((p, i) =>
          p.ok ? (
            <li key={i} className="flex items-start gap-2 py-2" data-testid="order-line">
              <button type="button" className="flex-1 text-left" onClick={() => onEditLine(i)}>
                <span className="block text-lg font-semibold">
                  {p.line.itemName}
                  {p.line.size && p.line.size.name !== 'Regular' ? ` · ${p.line.size.name}` : ''}
                  {p.line.size && sizeCount(p.line.menuItemId) > 1 ? ` · ${cupSizeLabel(p.line.size.volumeMl, menu.location.volumeUnit ?? 'ml')}` : ''}
                </span>
                <span className="block text-base text-ink-600">
                  {[p.line.milk?.name, p.line.shots ? `${p.line.shots} shots` : null, ...p.line.modifiers.map((m) => m.name), p.line.note]
                    .filter(Boolean)
                    .join(' · ')}
                </span>
              </button>
              <span className="text-lg font-semibold">{money(p.line.priceCents)}</span>
              <Button tone="quiet" aria-label={`Remove ${p.line.itemName}`} onClick={() => onRemoveLine(i)}>
                ✕
              </Button>
            </li>
          ) : (
            <li key={i} className="py-2 font-semibold text-copper-700">
              {p.problem.message}
              <Button tone="quiet" className="ml-2" onClick={() => onRemoveLine(i)}>
                Remove
              </Button>
            </li>
          ),
        )}
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
