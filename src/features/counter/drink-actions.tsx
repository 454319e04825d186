// One drink of an order in Today's orders: what became of it (made, at the bar, refunded, a
// remake) in words, and, for who may, "Refund drink" (its share of the total, worked out as the
// server does) and "Remake" (a reason from the list and a note). The bar sees either at once.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { formatCents } from '@/domain/money';
import { drinkRefundCents, REMAKE_REASON_LABELS, REMAKE_REASON_SHORT, REMAKE_REASONS, type RemakeReason } from '@/domain/remakes';
import type { OrderLineView, OrderView } from '@/domain/types';
import { Button } from '@/components/ui/button';
import { send } from '@/lib/commands';
import { ApiError } from '@/lib/http';
import { orderKeys } from '@/queries/orders';

function stateWords(line: OrderLineView): string {
  if (line.refundedAt) return 'refunded';
  if (line.status === 'done') return line.remadeAs ? 'made · remade' : 'made';
  return line.status === 'making' ? 'being made' : 'at the bar';
}

/** What refunding this drink gives back now (src/domain/remakes.ts, as the server works it out). */
export function drinkRefundOf(order: OrderView, line: OrderLineView): number {
  const standing = order.lines.filter((l) => !l.remake && !l.refundedAt).reduce((a, l) => a + l.priceCents, 0);
  return drinkRefundCents(order, standing, line.priceCents);
}

export function DrinkActions({ order, canRefund, canRemake, currency }: { order: OrderView; canRefund: boolean; canRemake: boolean; currency: string }) {
  const drinks = order.lines.filter((l) => l.station === 'bar');
  if (drinks.length === 0) return null;
  return (
    <ul className="mt-2 space-y-1" aria-label={`Drinks on #${order.number}`}>
      {drinks.map((line) => (
        <DrinkRow key={line.id} order={order} line={line} canRefund={canRefund} canRemake={canRemake} currency={currency} />
      ))}
    </ul>
  );
}

function DrinkRow({
  order,
  line,
  canRefund,
  canRemake,
  currency,
}: {
  order: OrderView;
  line: OrderLineView;
  canRefund: boolean;
  canRemake: boolean;
  currency: string;
}) {
  const qc = useQueryClient();
  const ids = useId();
  const [acting, setActing] = useState<'refund' | 'remake' | null>(null);
  const [reason, setReason] = useState('');
  const [remakeReason, setRemakeReason] = useState<RemakeReason>('made_wrong');
  const [note, setNote] = useState('');
  const money = (c: number) => formatCents(c, currency);
  const back = drinkRefundOf(order, line);
  const act = useMutation({
    mutationFn: () =>
      acting === 'refund'
        ? send.refundDrink({ id: line.id, reason })
        : send.remakeDrink({ id: line.id, reason: remakeReason, ...(note.trim() ? { note } : {}) }),
    onSuccess: () => {
      setActing(null);
      setReason('');
      setNote('');
      qc.invalidateQueries({ queryKey: orderKeys.all });
    },
  });
  const paid = order.paymentStatus === 'paid';
  const mayRefund = canRefund && paid && !line.refundedAt && !line.remake && back > 0 && back <= order.totalCents + order.tipCents - order.refundedCents;
  const mayRemake = canRemake && order.paymentStatus !== 'unpaid' && order.status !== 'void' && line.status === 'done' && !line.refundedAt && !line.remadeAs;
  const noteNeeded = remakeReason === 'other' && note.trim().length < 3;
  const label = `${line.itemName}${line.sizeName ? ` (${line.sizeName})` : ''}`;

  return (
    <li data-testid="order-drink" className="rounded-md border border-steam-200 bg-steam-100/60 px-2 py-1">
      <div className="flex flex-wrap items-center gap-2">
        {line.remake && (
          <span data-testid="remake-mark" className="rounded border-2 border-dashed border-ink-900 px-1 text-sm font-bold tracking-wide uppercase">
            Remake
          </span>
        )}
        <span className="font-semibold">{label}</span>
        <span className="text-ink-600">
          {stateWords(line)}
          {line.remake ? ` · ${REMAKE_REASON_SHORT[line.remake.reason]}${line.remake.note ? `: ${line.remake.note}` : ''}` : ''}
        </span>
        <span className="ml-auto flex gap-2">
          {mayRefund && (
            <Button tone="quiet" onClick={() => setActing(acting === 'refund' ? null : 'refund')} aria-expanded={acting === 'refund'}>
              Refund drink…
            </Button>
          )}
          {mayRemake && (
            <Button tone="quiet" onClick={() => setActing(acting === 'remake' ? null : 'remake')} aria-expanded={acting === 'remake'}>
              Remake…
            </Button>
          )}
        </span>
      </div>
      {act.error && (
        <p role="alert" className="mt-1 rounded-lg bg-alert-ink px-3 py-1 font-semibold">
          {act.error instanceof ApiError ? act.error.message : 'That did not work'}
        </p>
      )}
      {acting === 'refund' && (
        <div className="mt-2 flex gap-2">
          <input
            aria-label={`Why refund the ${label}`}
            placeholder="Reason (required)"
            className="flex-1 rounded-md border border-steam-200 px-2 py-2"
            value={reason}
            onChange={(e) => setReason(e.target.value)}
          />
          <Button disabled={reason.trim().length < 3 || act.isPending} onClick={() => act.mutate()}>
            Refund {money(back)}
          </Button>
        </div>
      )}
      {acting === 'remake' && (
        <fieldset className="mt-2 space-y-2">
          <legend className="font-semibold">Why is it made again? (no charge)</legend>
          <div className="grid gap-1 sm:grid-cols-2">
            {REMAKE_REASONS.map((r) => (
              <label key={r} className="flex items-center gap-2">
                <input type="radio" name={`${ids}-reason`} value={r} checked={remakeReason === r} onChange={() => setRemakeReason(r)} />
                {REMAKE_REASON_LABELS[r]}
              </label>
            ))}
          </div>
          <div className="flex gap-2">
            <input
              aria-label="Note for the bar"
              placeholder={remakeReason === 'other' ? 'What went wrong (required)' : 'Note for the bar (optional)'}
              maxLength={140}
              className="flex-1 rounded-md border border-steam-200 px-2 py-2"
              value={note}
              onChange={(e) => setNote(e.target.value)}
            />
            <Button disabled={noteNeeded || act.isPending} onClick={() => act.mutate()}>
              Send remake to the bar
            </Button>
          </div>
        </fieldset>
      )}
    </li>
  );
}
