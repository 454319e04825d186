// The order being built: its lines, the customer's name, cash tendered, and Send.
import type { UseFormReturn } from 'react-hook-form';
import { cashQuickAmounts, formatCents, orderTotals, parseAmountToCents } from '../../domain/money';
import { resolveLine } from '../../domain/order-lines';
import type { OrderDraft } from '../../domain/schemas';
import type { MenuView } from '../../domain/types';
import { Button } from '../../components/ui/button';
import { FieldError } from '../../components/ui/field-error';

interface Props {
  menu: MenuView;
  form: UseFormReturn<OrderDraft>;
  tendered: string;
  onTendered(text: string): void;
  onEditLine(index: number): void;
  onRemoveLine(index: number): void;
  sending: boolean;
  error: string | null;
}

export function OrderPanel({ menu, form, tendered, onTendered, onEditLine, onRemoveLine, sending, error }: Props) {
  const items = form.watch('items');
  const money = (c: number) => formatCents(c, menu.location.currency);
  const priced = items.map((l) => resolveLine(menu, l));
  const totals = orderTotals(
    priced.map((p) => (p.ok ? p.line.priceCents : 0)),
    menu.location,
  );
  const tenderedCents = tendered.trim() === '' ? totals.totalCents : parseAmountToCents(tendered);
  const change = tenderedCents === null ? null : tenderedCents - totals.totalCents;
  const { errors } = form.formState;

  return (
    <aside aria-label="Order" className="flex min-h-0 flex-col rounded-2xl border border-steam-200 bg-white p-4">
      <h2 className="text-2xl font-semibold">Order</h2>
      <ol className="mt-2 flex-1 divide-y divide-steam-200 overflow-y-auto" aria-label="Order lines">
        {items.length === 0 && <li className="py-6 text-center text-lg text-ink-600">Tap an item to start</li>}
        {priced.map((p, i) =>
          p.ok ? (
            <li key={i} className="flex items-start gap-2 py-2" data-testid="order-line">
              <button type="button" className="flex-1 text-left" onClick={() => onEditLine(i)}>
                <span className="block text-lg font-semibold">
                  {p.line.itemName}
                  {p.line.size && p.line.size.name !== 'Regular' ? ` · ${p.line.size.name}` : ''}
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
      <FieldError message={errors.items?.message ?? errors.items?.root?.message} />

      <dl className="mt-2 grid grid-cols-2 gap-y-1 border-t border-steam-200 pt-2 text-lg">
        <dt>Subtotal</dt>
        <dd className="text-right">{money(totals.subtotalCents)}</dd>
        <dt>Tax</dt>
        <dd className="text-right">{money(totals.taxCents)}</dd>
        <dt className="text-2xl font-semibold">Total</dt>
        <dd data-testid="order-total" className="text-right text-2xl font-semibold">
          {money(totals.totalCents)}
        </dd>
      </dl>

      <label className="mt-3 block text-base font-semibold" htmlFor="customerName">
        Name for the cup
      </label>
      <input
        id="customerName"
        autoComplete="off"
        className="mt-1 w-full rounded-lg border border-steam-200 px-3 py-3 text-xl"
        aria-invalid={!!errors.customerName}
        {...form.register('customerName')}
      />
      <FieldError message={errors.customerName?.message} />

      <label className="mt-3 block text-base font-semibold" htmlFor="tendered">
        Cash tendered <span className="font-normal text-ink-600">(blank = exact)</span>
      </label>
      <div className="mt-1 flex flex-wrap gap-2">
        <input
          id="tendered"
          inputMode="decimal"
          autoComplete="off"
          placeholder={money(totals.totalCents)}
          className="w-32 rounded-lg border border-steam-200 px-3 py-3 text-xl"
          value={tendered}
          onChange={(e) => onTendered(e.target.value)}
        />
        {cashQuickAmounts(totals.totalCents).map((a) => (
          <Button key={a} tone="quiet" size="lg" className="px-3" onClick={() => onTendered((a / 100).toFixed(2))}>
            {money(a)}
          </Button>
        ))}
      </div>
      <p className="mt-2 text-xl" aria-live="polite">
        {change === null ? (
          <span className="font-semibold text-copper-700">Enter an amount like 20 or 20.50</span>
        ) : change < 0 ? (
          <span className="font-semibold text-copper-700">{money(-change)} still due</span>
        ) : (
          <>
            Change due <strong data-testid="change-due">{money(change)}</strong>
          </>
        )}
      </p>
      {error && (
        <p role="alert" className="mt-2 rounded-lg bg-alert-ink px-3 py-2 text-lg font-semibold text-ink-900">
          {error}
        </p>
      )}
      <Button type="submit" size="xl" className="mt-3 w-full" disabled={sending || items.length === 0 || change === null || change < 0}>
        {sending ? 'Sending…' : `Send · ${money(totals.totalCents)}`}
      </Button>
    </aside>
  );
}
