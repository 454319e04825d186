// Paying: the name for the cup, here or to go, allergies, a receipt address, a lead's discount,
// and cash (with change) or card (through the card reader).
import { useState } from 'react';
import type { UseFormReturn } from 'react-hook-form';
import { cashQuickAmounts, formatCents } from '../../domain/money';
import type { OrderDraft, OrderDraftInput } from '../../domain/schemas';
import type { MenuView } from '../../domain/types';
import { Button } from '../../components/ui/button';
import { FieldError } from '../../components/ui/field-error';
import { Segmented } from '../../components/ui/segmented';
import { AllergyPicker } from './allergy-picker';
import { clashesOf, tenderedCents, type Checkout } from './checkout';
import { DiscountEditor } from './discount-editor';
import { TEST_CARDS } from './test-cards';

interface Props {
  menu: MenuView;
  form: UseFormReturn<OrderDraftInput, unknown, OrderDraft>;
  checkout: Checkout;
  onCheckout(c: Checkout): void;
  totalCents: number;
  canDiscount: boolean;
  sending: boolean;
  error: string | null;
}

export function CheckoutPanel({ menu, form, checkout, onCheckout, totalCents, canDiscount }: Omit<Props, 'sending' | 'error'>) {
  const money = (c: number) => formatCents(c, menu.location.currency);
  const [allergyOpen, setAllergyOpen] = useState(false);
  const allergens = form.watch('allergens') ?? [];
  const note = form.watch('allergyNote') ?? '';
  const { errors } = form.formState;
  const tendered = tenderedCents(checkout, totalCents);
  const change = tendered === null ? null : tendered - totalCents;
  const set = (patch: Partial<Checkout>) => onCheckout({ ...checkout, ...patch });

  return (
    <div className="flex flex-col gap-3 border-t border-steam-200 pt-3">
      <div className="flex items-end gap-2">
        <label className="flex-1">
          <span className="block text-base font-semibold">Name for the cup</span>
          <input
            id="customerName"
            autoComplete="off"
            className="mt-1 w-full rounded-lg border border-steam-200 px-3 py-3 text-xl"
            aria-invalid={!!errors.customerName}
            {...form.register('customerName')}
          />
        </label>
        <Button
          tone={allergens.length || note ? 'primary' : 'quiet'}
          size="lg"
          aria-expanded={allergyOpen}
          onClick={() => setAllergyOpen(!allergyOpen)}
        >
          ⚠ Allergy{allergens.length ? ` (${allergens.length})` : ''}
        </Button>
      </div>
      <FieldError message={errors.customerName?.message} />
      {allergyOpen && (
        <AllergyPicker
          list={menu.location.allergenList}
          value={allergens}
          note={note}
          onChange={(a) => form.setValue('allergens', a)}
          onNote={(n) => form.setValue('allergyNote', n || undefined)}
        />
      )}
      <div className="flex flex-wrap gap-x-6 gap-y-3">
        <Segmented
          label="Service"
          value={form.watch('service')}
          onChange={(service) => form.setValue('service', service)}
          options={[
            { value: 'takeaway', label: 'To go' },
            { value: 'dine_in', label: 'Here' },
          ]}
        />
        <Segmented
          label="Payment"
          value={checkout.method}
          onChange={(method) => set({ method })}
          options={[
            { value: 'cash', label: 'Cash' },
            { value: 'card', label: 'Card' },
          ]}
        />
      </div>
      {checkout.method === 'cash' ? (
        <div>
          <label className="block text-base font-semibold" htmlFor="tendered">
            Cash tendered <span className="font-normal text-ink-600">(blank = exact)</span>
          </label>
          <div className="mt-1 flex flex-wrap gap-2">
            <input
              id="tendered"
              inputMode="decimal"
              autoComplete="off"
              placeholder={money(totalCents)}
              className="w-28 rounded-lg border border-steam-200 px-3 py-3 text-xl"
              value={checkout.tendered}
              onChange={(e) => set({ tendered: e.target.value })}
            />
            {cashQuickAmounts(totalCents).map((a) => (
              <Button key={a} tone="quiet" size="lg" className="px-3" onClick={() => set({ tendered: (a / 100).toFixed(2) })}>
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
        </div>
      ) : (
        <fieldset className="rounded-lg border border-steam-200 bg-white p-3">
          <legend className="px-1 text-sm font-semibold tracking-widest text-ink-600 uppercase">Card reader (test cards)</legend>
          <div role="radiogroup" aria-label="Card presented" className="grid grid-cols-2 gap-2">
            {TEST_CARDS.map((c) => (
              <button
                key={c.paymentMethod}
                type="button"
                role="radio"
                aria-checked={checkout.paymentMethod === c.paymentMethod}
                onClick={() => set({ paymentMethod: c.paymentMethod })}
                className={`min-h-14 rounded-lg border-2 px-2 text-left ${checkout.paymentMethod === c.paymentMethod ? 'border-ink-900 bg-ink-900 text-steam-50' : 'border-steam-200'}`}
              >
                <span className="block font-semibold">{c.label}</span>
                <span className="block text-sm">{c.outcome}</span>
              </button>
            ))}
          </div>
        </fieldset>
      )}
      <label>
        <span className="block text-sm font-semibold tracking-widest text-ink-600 uppercase">E-mail receipt (optional)</span>
        <input
          type="email"
          inputMode="email"
          autoComplete="off"
          className="mt-1 w-full rounded-lg border border-steam-200 px-3 py-2 text-lg"
          value={checkout.email}
          onChange={(e) => set({ email: e.target.value })}
        />
      </label>
      {canDiscount && <DiscountEditor value={checkout.discount} onChange={(discount) => set({ discount })} />}
    </div>
  );
}

/** Always in view at the bottom of the order: what went wrong, and the one big action. */
export function SendBar({ menu, form, checkout, onCheckout, totalCents, sending, error }: Omit<Props, 'canDiscount'>) {
  const tendered = tenderedCents(checkout, totalCents);
  const items = form.watch('items');
  const clashes = clashesOf(menu, items, form.watch('allergens') ?? []);
  const ready =
    (checkout.method === 'card' ? checkout.paymentMethod !== null : tendered !== null && tendered >= totalCents) &&
    (clashes.length === 0 || checkout.clashConfirmed);
  return (
    <div className="flex flex-col gap-2 border-t border-steam-200 bg-white pt-3">
      {clashes.length > 0 && (
        // compact: on a 768 px tablet it shares the column with the name, payment and Send
        <div role="alert" data-testid="allergy-clash" className="rounded-lg border-2 border-ink-900 bg-alert-ink px-3 py-1.5 text-ink-900">
          {clashes.map((c) => (
            <p key={c.itemName} className="text-base leading-snug font-semibold">
              ⚠ {c.itemName} contains {c.allergens.join(', ')}
              {c.from.length > 0 && ` (from ${c.from.join(', ')})`} — on the customer’s allergy list.
            </p>
          ))}
          <label className="mt-1 flex items-center gap-2 text-base">
            <input
              type="checkbox"
              className="size-5"
              checked={checkout.clashConfirmed}
              onChange={(e) => onCheckout({ ...checkout, clashConfirmed: e.target.checked })}
            />
            Change the drink — or tick if the customer confirmed they want it
          </label>
        </div>
      )}
      {error && (
        <p role="alert" className="rounded-lg bg-alert-ink px-3 py-2 text-lg font-semibold text-ink-900">
          {error}
        </p>
      )}
      <Button type="submit" size="xl" className="w-full" disabled={items.length === 0 || sending || !ready}>
        {sending ? 'Sending…' : `${checkout.method === 'card' ? 'Charge card' : 'Send'} · ${formatCents(totalCents, menu.location.currency)}`}
      </Button>
    </div>
  );
}
