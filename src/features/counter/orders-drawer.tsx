// Today's orders for the cashier: search, status, reprint; a lead can void an unpaid order or
// refund a paid one, with a reason, and the bar sees it at once; per drink, refund one or remake
// one (drink-actions.tsx).
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import { formatCents } from '@/domain/money';
import type { OrderView } from '@/domain/types';
import { Button } from '@/components/ui/button';
import { useModalFocus } from '@/components/ui/use-modal-focus';
import { useApi } from '@/lib/api-context';
import { send } from '@/lib/commands';
import { ApiError } from '@/lib/http';
import { orderKeys, ordersQuery } from '@/queries/orders';
import { DrinkActions } from './drink-actions';

const STATUS: Record<OrderView['status'], string> = {
  pending: 'waiting for payment',
  open: 'at the bar',
  ready: 'ready',
  collected: 'collected',
  void: 'void',
};

export function OrdersDrawer({ canRefund, canRemake, currency, onClose }: { canRefund: boolean; canRemake: boolean; currency: string; onClose(): void }) {
  const api = useApi();
  const qc = useQueryClient();
  const [q, setQ] = useState('');
  const [acting, setActing] = useState<{ id: number; kind: 'refund' | 'void'; paymentId?: number } | null>(null);
  const [reason, setReason] = useState('');
  const list = useQuery(ordersQuery(api, q));
  const act = useMutation({
    mutationFn: ({ id, kind, paymentId }: { id: number; kind: 'refund' | 'void'; paymentId?: number }) =>
      kind === 'refund' ? send.refundOrder({ id, reason, paymentId }) : send.voidOrder({ id, reason }),
    onSuccess: () => {
      setActing(null);
      setReason('');
      qc.invalidateQueries({ queryKey: orderKeys.all });
    },
  });
  const money = (c: number) => formatCents(c, currency);
  const panel = useRef<HTMLDivElement>(null);
  useModalFocus(panel, (box) => box.querySelector<HTMLElement>('input'));
  const latestClose = useRef(onClose);
  latestClose.current = onClose;
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => e.key === 'Escape' && latestClose.current();
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);

  return (
    <div role="dialog" aria-modal="true" aria-label="Today’s orders" className="fixed inset-0 z-30 flex justify-end bg-ink-900/40">
      <div ref={panel} className="flex h-full w-[40rem] max-w-full flex-col bg-steam-50 p-5 shadow-2xl">
        <div className="flex items-center gap-3">
          <h2 className="text-2xl font-semibold">Today’s orders</h2>
          <Button tone="quiet" className="ml-auto" onClick={onClose}>
            Close
          </Button>
        </div>
        <input
          aria-label="Find an order by name or number"
          placeholder="Name or #number"
          className="mt-3 rounded-lg border border-steam-200 px-3 py-3 text-lg"
          value={q}
          onChange={(e) => setQ(e.target.value)}
        />
        {act.error && (
          <p role="alert" className="mt-2 rounded-lg bg-alert-ink px-3 py-2 font-semibold">
            {act.error instanceof ApiError ? act.error.message : 'That did not work'}
          </p>
        )}
        <ul className="mt-3 flex-1 divide-y divide-steam-200 overflow-y-auto">
          {list.data?.orders.map((o) => (
            <li key={o.id} className="py-3" data-testid="order-row">
              <div className="flex items-baseline gap-3">
                <strong className="font-display text-3xl">#{o.number}</strong>
                <span className="text-lg font-semibold">{o.customerName}</span>
                <span className="text-ink-600">{STATUS[o.status]}</span>
                <span className="ml-auto text-lg">{money(o.totalCents)}</span>
              </div>
              <p className="text-ink-600">
                {paymentWords(o, money)} · {o.paymentStatus}
                {o.refundedCents > 0 ? ` · refunded ${money(o.refundedCents)}` : ''} · {o.lines.map((l) => l.itemName).join(', ')}
              </p>
              <div className="mt-1 flex flex-wrap gap-2">
                <a className="underline" href={`/receipts/${o.id}`} target="_blank" rel="noreferrer">
                  Reprint receipt
                </a>
                {canRefund && refundable(o) > 0 && (
                  <Button tone="quiet" onClick={() => setActing({ id: o.id, kind: 'refund' })}>
                    {o.status === 'pending' ? 'Give back and void…' : 'Refund…'}
                  </Button>
                )}
                {/* each part of a split on its own: the cash back from the till, a card to its card */}
                {canRefund &&
                  o.payment.method === 'split' &&
                  o.payment.parts
                    .filter((p) => p.amountCents > p.refundedCents)
                    .map((p) => (
                      <Button key={p.paymentId} tone="quiet" onClick={() => setActing({ id: o.id, kind: 'refund', paymentId: p.paymentId })}>
                        Refund part {p.part}…
                      </Button>
                    ))}
                {canRefund && o.status === 'pending' && o.payment.parts.length === 0 && (
                  <Button tone="quiet" onClick={() => setActing({ id: o.id, kind: 'void' })}>
                    Void…
                  </Button>
                )}
              </div>
              <DrinkActions order={o} canRefund={canRefund} canRemake={canRemake} currency={currency} />
              {acting?.id === o.id && (
                <div className="mt-2 flex gap-2">
                  <input
                    aria-label="Reason"
                    placeholder="Reason (required)"
                    className="flex-1 rounded-md border border-steam-200 px-2 py-2"
                    value={reason}
                    onChange={(e) => setReason(e.target.value)}
                  />
                  <Button disabled={reason.trim().length < 3 || act.isPending} onClick={() => act.mutate(acting)}>
                    {acting.kind === 'void' ? 'Void order' : refundLabel(o, acting.paymentId, money)}
                  </Button>
                </div>
              )}
            </li>
          ))}
          {list.data?.orders.length === 0 && <li className="py-6 text-center text-ink-600">No orders yet today</li>}
        </ul>
      </div>
    </div>
  );
}

/** What the customer paid and has not had back, the tip included. */
const refundable = (o: OrderView) => o.payment.parts.reduce((sum, p) => sum + p.amountCents, 0) - o.refundedCents;

function paymentWords(o: OrderView, money: (c: number) => string): string {
  if (o.payment.method !== 'split') return o.payment.method === 'card' ? 'Card' : 'Cash';
  return `Split: ${o.payment.parts.map((p) => `${p.method} ${money(p.amountCents)}`).join(' + ')}`;
}

function refundLabel(o: OrderView, paymentId: number | undefined, money: (c: number) => string): string {
  const part = o.payment.parts.find((p) => p.paymentId === paymentId);
  if (part) return `Refund part ${part.part} · ${part.method} ${money(part.amountCents - part.refundedCents)}`;
  return `Refund ${money(refundable(o))}`;
}
