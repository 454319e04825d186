// A lead's discount: a whole percent or an amount, always with a reason.
import { useState } from 'react';
import { parseAmountToCents } from '@/domain/money';
import type { DiscountInput } from '@/domain/schemas';
import { Button } from '@/components/ui/button';

export function DiscountEditor({ value, onChange }: { value: DiscountInput | null; onChange(d: DiscountInput | null): void }) {
  const [open, setOpen] = useState(value !== null);
  const [kind, setKind] = useState<DiscountInput['kind']>(value?.kind ?? 'percent');
  const [amount, setAmount] = useState(value ? String(value.kind === 'percent' ? value.value : value.value / 100) : '');
  const [reason, setReason] = useState(value?.reason ?? '');
  if (!open) {
    return (
      <Button tone="quiet" onClick={() => setOpen(true)}>
        Add a discount (lead)
      </Button>
    );
  }
  const apply = () => {
    const v = kind === 'percent' ? Number(amount) : parseAmountToCents(amount);
    if (v && Number.isInteger(v) && v > 0 && reason.trim().length >= 3) onChange({ kind, value: v, reason: reason.trim() });
  };
  return (
    <fieldset className="rounded-lg border border-steam-200 bg-white p-3">
      <legend className="px-1 text-sm font-semibold tracking-widest text-ink-600 uppercase">Discount</legend>
      <div className="flex flex-wrap items-center gap-2">
        <select
          aria-label="Discount kind"
          className="rounded-md border border-steam-200 px-2 py-2"
          value={kind}
          onChange={(e) => setKind(e.target.value as DiscountInput['kind'])}
        >
          <option value="percent">% off</option>
          <option value="amount">$ off</option>
        </select>
        <input
          aria-label="Discount amount"
          className="w-20 rounded-md border border-steam-200 px-2 py-2"
          value={amount}
          onChange={(e) => setAmount(e.target.value)}
        />
        <input
          aria-label="Discount reason"
          placeholder="Reason"
          className="min-w-0 flex-1 rounded-md border border-steam-200 px-2 py-2"
          value={reason}
          onChange={(e) => setReason(e.target.value)}
        />
      </div>
      <div className="mt-2 flex gap-2">
        <Button tone="quiet" onClick={apply}>
          Apply
        </Button>
        <Button
          tone="quiet"
          onClick={() => {
            onChange(null);
            setOpen(false);
          }}
        >
          Remove
        </Button>
        {value && <span className="self-center text-sm text-ink-600">Applied: {value.reason}</span>}
      </div>
    </fieldset>
  );
}
