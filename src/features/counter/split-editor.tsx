// Paying in parts at the Counter: each part cash (with what was handed over) or a card, the last
// part always what the others leave, so the parts add up to the amount due by construction. After
// a declined card the parts already taken show as paid and stay as they were.
import { formatCents, parseAmountToCents } from '@/domain/money';
import { SPLIT_PARTS_MAX } from '@/domain/split-payment';
import { Button } from '@/components/ui/button';
import { cn } from '@/lib/cn';
import { emptySplitPart, splitAmounts, type Checkout, type SplitPartDraft } from './checkout';
import { TEST_CARDS } from './test-cards';

const input = 'w-20 rounded-lg border border-steam-200 px-2 py-2 text-lg md:w-24';

export function SplitEditor({
  checkout,
  onCheckout,
  dueCents,
  currency,
}: {
  checkout: Checkout;
  onCheckout(c: Checkout): void;
  dueCents: number;
  currency: string;
}) {
  const money = (c: number) => formatCents(c, currency);
  const amounts = splitAmounts(checkout.split, dueCents);
  const setPart = (i: number, patch: Partial<SplitPartDraft>) =>
    onCheckout({ ...checkout, split: checkout.split.map((p, j) => (j === i ? { ...p, ...patch } : p)) });
  const last = checkout.split.length - 1;
  return (
    <fieldset className="min-w-0 rounded-lg border border-steam-200 bg-white px-2 pb-2" data-testid="split-editor">
      <legend className="px-1 text-sm font-semibold tracking-widest text-ink-600 uppercase">Parts</legend>
      <ol className="flex flex-col gap-2">
        {checkout.split.map((p, i) => {
          const paid = checkout.paidParts.includes(i + 1);
          const amount = amounts[i];
          const tendered = p.tendered.trim() === '' ? null : p.tendered;
          return (
            <li key={i} className={cn('rounded-lg border px-2 py-1.5', paid ? 'border-ink-900 bg-steam-100' : 'border-steam-200')} data-testid="split-part">
              <div className="flex flex-wrap items-center gap-2">
                <strong className="shrink-0">Part {i + 1}</strong>
                <div role="radiogroup" aria-label={`Part ${i + 1} paid by`} className="flex gap-1">
                  {(['cash', 'card'] as const).map((m) => (
                    <button
                      key={m}
                      type="button"
                      role="radio"
                      aria-checked={p.method === m}
                      disabled={paid}
                      onClick={() => setPart(i, { method: m })}
                      className={cn(
                        'min-h-11 rounded-lg border-2 px-3 font-semibold',
                        p.method === m ? 'border-ink-900 bg-ink-900 text-steam-50' : 'border-steam-200 bg-white',
                      )}
                    >
                      {p.method === m && <span aria-hidden>✓ </span>}
                      {m === 'cash' ? 'Cash' : 'Card'}
                    </button>
                  ))}
                </div>
                {i < last ? (
                  <input
                    aria-label={`Part ${i + 1} amount`}
                    inputMode="decimal"
                    autoComplete="off"
                    placeholder="0.00"
                    disabled={paid}
                    className={input}
                    value={p.amount}
                    onChange={(e) => setPart(i, { amount: e.target.value })}
                  />
                ) : (
                  <span data-testid="split-rest">
                    the rest <strong>{money(amount ?? 0)}</strong>
                  </span>
                )}
                {paid && <strong className="ml-auto">✓ Paid</strong>}
                {!paid && checkout.split.length > 2 && (
                  <Button
                    tone="quiet"
                    className="ml-auto min-h-11 px-3"
                    aria-label={`Remove part ${i + 1}`}
                    onClick={() => onCheckout({ ...checkout, split: checkout.split.filter((_, j) => j !== i) })}
                  >
                    ✕
                  </Button>
                )}
              </div>
              {!paid && p.method === 'cash' && (
                <label className="mt-1 flex items-center gap-2">
                  <span className="shrink-0">Cash handed over</span>
                  <input
                    inputMode="decimal"
                    autoComplete="off"
                    placeholder={amount !== null ? money(amount) : ''}
                    className={input}
                    value={p.tendered}
                    onChange={(e) => setPart(i, { tendered: e.target.value })}
                  />
                  {tendered !== null && amount !== null && <ChangeOf typed={tendered} amountCents={amount} money={money} />}
                </label>
              )}
              {!paid && p.method === 'card' && (
                <label className="mt-1 flex items-center gap-2">
                  <span className="shrink-0">Card presented</span>
                  <select
                    className="min-h-11 min-w-0 flex-1 rounded-lg border border-steam-200 bg-white px-2 md:flex-none"
                    value={p.paymentMethod ?? ''}
                    onChange={(e) => setPart(i, { paymentMethod: e.target.value || null })}
                  >
                    <option value="">Choose…</option>
                    {TEST_CARDS.map((c) => (
                      <option key={c.paymentMethod} value={c.paymentMethod}>
                        {c.label} ({c.outcome})
                      </option>
                    ))}
                  </select>
                </label>
              )}
            </li>
          );
        })}
      </ol>
      {checkout.split.length < SPLIT_PARTS_MAX && (
        <Button tone="quiet" className="mt-2 min-h-11" onClick={() => onCheckout({ ...checkout, split: [...checkout.split, emptySplitPart('card')] })}>
          + Another part
        </Button>
      )}
    </fieldset>
  );
}

function ChangeOf({ typed, amountCents, money }: { typed: string; amountCents: number; money(c: number): string }) {
  const cents = parseAmountToCents(typed);
  if (cents === null) return null;
  const change = cents - amountCents;
  return <span aria-live="polite">{change >= 0 ? `change ${money(change)}` : `${money(-change)} short`}</span>;
}
