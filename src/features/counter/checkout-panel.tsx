// Paying: the name for the cup, here or to go, allergies, a receipt address, a lead's discount,
// and cash (with change), card (through the card reader) or both in parts.
import { useId, useState, type ReactNode } from 'react';
import type { UseFormReturn } from 'react-hook-form';
import { cashQuickAmounts, formatCents } from '@/domain/money';
import type { OrderDraft, OrderDraftInput } from '@/domain/schemas';
import type { MenuView } from '@/domain/types';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { Segmented } from '@/components/ui/segmented';
import { AllergyPicker } from './allergy-picker';
import { blockedLines, clashesOf, splitParts, tenderedCents, type Checkout } from './checkout';
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

/**
 * In the order's scrolling part, under the lines: a receipt address and a lead's discount. The
 * hint says everything the address is used for (the receipt, and the ready note when the café
 * sends it), so the cashier can tell the customer before they give it.
 */
export function CheckoutPanel({ menu, checkout, onCheckout, canDiscount }: Omit<Props, 'sending' | 'error'>) {
  const set = (patch: Partial<Checkout>) => onCheckout({ ...checkout, ...patch });
  const hintId = useId();
  const readyMail = menu.location.readyMail ?? true;
  return (
    <div className="mt-3 flex flex-col gap-3 border-t border-steam-200 pt-3">
      <div>
        <label>
          <span className="block text-sm font-semibold tracking-widest text-ink-600 uppercase">E-mail receipt (optional)</span>
          <input
            type="email"
            inputMode="email"
            autoComplete="off"
            aria-describedby={hintId}
            className="mt-1 w-full rounded-lg border border-steam-200 px-3 py-2 text-lg"
            value={checkout.email}
            onChange={(e) => set({ email: e.target.value })}
          />
        </label>
        <p id={hintId} className="mt-1 text-sm text-ink-600">
          {readyMail ? 'Used for the receipt and one note when the order is ready; nothing else.' : 'Used for the receipt only; nothing else.'}
        </p>
      </div>
      {canDiscount && <DiscountEditor value={checkout.discount} onChange={(discount) => set({ discount })} />}
    </div>
  );
}

/**
 * Pinned under the order's lines, so on a 1024×768 tablet the name, here or to go, and every
 * payment choice are in view without scrolling, however long the order.
 */
export function PaymentPanel({
  menu,
  form,
  checkout,
  onCheckout,
  totalCents,
  tipPicker,
  split,
}: Omit<Props, 'sending' | 'error' | 'canDiscount'> & { tipPicker?: ReactNode; split?: ReactNode }) {
  const money = (c: number) => formatCents(c, menu.location.currency);
  const [allergyOpen, setAllergyOpen] = useState(false);
  const allergens = form.watch('allergens') ?? [];
  const note = form.watch('allergyNote') ?? '';
  const { errors } = form.formState;
  const tendered = tenderedCents(checkout, totalCents);
  const change = tendered === null ? null : tendered - totalCents;
  const set = (patch: Partial<Checkout>) => onCheckout({ ...checkout, ...patch });

  return (
    <div className="flex shrink-0 flex-col gap-2 border-t border-steam-200 pt-2">
      <div className="flex items-end gap-2">
        <label className="min-w-0 flex-1">
          <span className="block text-base font-semibold">Name for the cup</span>
          <input
            id="customerName"
            autoComplete="off"
            className="mt-1 w-full rounded-lg border border-steam-200 px-3 py-2 text-xl"
            aria-invalid={!!errors.customerName}
            {...form.register('customerName')}
          />
        </label>
        <Button
          tone={allergens.length || note ? 'primary' : 'quiet'}
          className="min-h-12 text-lg"
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
      {/* service and payment share one row on a 1024×768 tablet (the card reader must stay in view under them) */}
      <div className="flex flex-wrap gap-x-3 gap-y-2">
        <Segmented
          snug
          label="Service"
          value={form.watch('service')}
          onChange={(service) => form.setValue('service', service)}
          options={[
            { value: 'takeaway', label: 'To go' },
            { value: 'dine_in', label: 'Here' },
          ]}
        />
        <Segmented
          snug
          label="Payment"
          value={checkout.method}
          onChange={(method) => set({ method })}
          options={[
            { value: 'cash', label: 'Cash' },
            { value: 'card', label: 'Card' },
            { value: 'split', label: 'Split' },
          ]}
        />
      </div>
      {tipPicker}
      {checkout.method === 'split' ? (
        split
      ) : checkout.method === 'cash' ? (
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
              className="w-28 rounded-lg border border-steam-200 px-3 py-2 text-xl"
              value={checkout.tendered}
              onChange={(e) => set({ tendered: e.target.value })}
            />
            {cashQuickAmounts(totalCents).map((a) => (
              <Button key={a} tone="quiet" className="min-h-12 px-3 text-lg" onClick={() => set({ tendered: (a / 100).toFixed(2) })}>
                {money(a)}
              </Button>
            ))}
          </div>
          <p className="mt-1 text-xl" aria-live="polite">
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
        <fieldset className="rounded-lg border border-steam-200 bg-white px-2 pb-2">
          <legend className="px-1 text-sm font-semibold tracking-widest text-ink-600 uppercase">Card reader (test cards)</legend>
          <div role="radiogroup" aria-label="Card presented" className="grid grid-cols-2 gap-2">
            {TEST_CARDS.map((c) => (
              <button
                key={c.paymentMethod}
                type="button"
                role="radio"
                aria-checked={checkout.paymentMethod === c.paymentMethod}
                onClick={() => set({ paymentMethod: c.paymentMethod })}
                className={`min-h-12 rounded-lg border-2 px-2 text-left leading-tight ${checkout.paymentMethod === c.paymentMethod ? 'border-ink-900 bg-ink-900 text-steam-50' : 'border-steam-200'}`}
              >
                <span className="block font-semibold">
                  {checkout.paymentMethod === c.paymentMethod && <span aria-hidden>✓ </span>}
                  {c.label}
                </span>
                <span className="block text-sm">{c.outcome}</span>
              </button>
            ))}
          </div>
        </fieldset>
      )}
    </div>
  );
}

/** Always in view at the bottom of the order: what went wrong, and the one big action. */
export function SendBar({ menu, form, checkout, onCheckout, totalCents, sending, error, tipOk = true }: Omit<Props, 'canDiscount'> & { tipOk?: boolean }) {
  const tendered = tenderedCents(checkout, totalCents);
  const items = form.watch('items');
  const clashes = clashesOf(menu, items, form.watch('allergens') ?? []);
  // a line that can't be made (86'd since it was added, or gone from the menu) blocks the order
  const blocked = blockedLines(menu, items);
  const split = checkout.method === 'split' ? splitParts(checkout.split, totalCents) : null;
  const paymentReady =
    checkout.method === 'split'
      ? split !== null && 'parts' in split
      : checkout.method === 'card'
        ? checkout.paymentMethod !== null
        : tendered !== null && tendered >= totalCents;
  const ready = blocked.length === 0 && tipOk && paymentReady && (clashes.length === 0 || checkout.clashConfirmed);
  return (
    <div className="flex shrink-0 flex-col gap-2 bg-white pt-2">
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
            Swap or remove it — or tick if the customer confirmed they want it
          </label>
        </div>
      )}
      {error && (
        <p role="alert" className="rounded-lg bg-alert-ink px-3 py-2 text-lg font-semibold text-ink-900">
          {error}
        </p>
      )}
      {split && 'problem' in split && (
        <p data-testid="split-problem" className="text-lg font-semibold text-ink-900">
          {split.problem}
        </p>
      )}
      {blocked.length > 0 && (
        <p data-testid="send-blocked" className="text-lg font-semibold text-ink-900">
          <span aria-hidden>⊘ </span>
          {blocked.join(', ')} {blocked.length === 1 ? 'is' : 'are'} 86'd — remove {blocked.length === 1 ? 'it' : 'them'} to send
        </p>
      )}
      <Button type="submit" size="xl" className="w-full" disabled={items.length === 0 || sending || !ready}>
        {sending
          ? 'Sending…'
          : `${checkout.method === 'card' ? 'Charge card' : checkout.method === 'split' ? 'Take the parts' : 'Send'}${blocked.length ? '' : ` · ${formatCents(totalCents, menu.location.currency)}`}`}
      </Button>
    </div>
  );
}
