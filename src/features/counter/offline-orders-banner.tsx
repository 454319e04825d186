// The strip under the Counter's header while there are offline orders: how many, whose, how
// much, and a "Send now". A held card order asks the cashier: charge the card now (the customer
// is there), they paid cash, or cancel. Told in words and a shape (the warning sign), never by
// colour alone.
import { useState } from 'react';
import { formatCents } from '@/domain/money';
import { plural } from '@/domain/plural';
import { Button } from '@/components/ui/button';
import type { OrderView } from '@/domain/types';
import type { OfflineOrder } from './offline-orders';
import type { OfflineOrders } from './use-offline-orders';

/** `onSent`: a held card order the cashier settled is on the server (the Counter says "Sent"). */
export function OfflineOrdersBanner({ offlineOrders, currency, onSent }: { offlineOrders: OfflineOrders; currency: string; onSent?(order: OrderView): void }) {
  const { orders, resending, retryNow } = offlineOrders;
  const [notice, setNotice] = useState<string | null>(null);
  if (orders.length === 0 && !notice) return null;
  const waiting = orders.filter((o) => o.state === 'waiting');
  const refused = orders.filter((o) => o.state === 'refused');
  const held = orders.filter((o) => o.state === 'held');
  const money = (c: number | null) => (c === null ? null : formatCents(c, currency));
  const parts = [
    held.length > 0 && `${plural(held.length, 'card order')} held — not charged; ask the customer`,
    waiting.length > 0 && `${plural(waiting.length, 'order')} not sent yet — will send when the server is back`,
    refused.length > 0 && `${plural(refused.length, 'order')} refused by the server — check and discard`,
  ].filter(Boolean);

  return (
    <section aria-labelledby="offline-orders-title" data-testid="offline-orders" className="border-b-4 border-alert-deep bg-alert-ink px-5 py-3 text-ink-900">
      <div className="flex flex-wrap items-center gap-4">
        <h2 id="offline-orders-title" className="text-xl font-semibold" aria-live="polite">
          <span aria-hidden className="mr-2">
            ⚠
          </span>
          {parts.join(' · ') || notice}
        </h2>
        {waiting.length > 0 && (
          <Button tone="quiet" className="ml-auto" disabled={resending} onClick={() => retryNow()}>
            {resending ? 'Sending…' : 'Send now'}
          </Button>
        )}
      </div>
      {notice && parts.length > 0 && <p className="mt-1 text-lg font-semibold">{notice}</p>}
      {notice && (
        <Button tone="quiet" className="mt-1" onClick={() => setNotice(null)}>
          OK
        </Button>
      )}
      <ul className="mt-2 flex flex-col gap-1 text-lg" aria-label="Orders not sent yet">
        {orders.map((o) => (
          <li key={o.clientOrderId} data-testid="offline-order" className="flex flex-wrap items-center gap-3">
            <strong>{o.body.customerName}</strong>
            {money(o.totalCents) && <span>{money(o.totalCents)}</span>}
            {o.state === 'waiting' && <span className="rounded border border-ink-900 px-2 text-base">Not sent yet</span>}
            {o.state === 'refused' && <Refused order={o} offlineOrders={offlineOrders} />}
            {o.state === 'held' && <Held order={o} offlineOrders={offlineOrders} money={money} onNotice={setNotice} onSent={onSent} />}
          </li>
        ))}
      </ul>
    </section>
  );
}

function Refused({ order: o, offlineOrders }: { order: OfflineOrder; offlineOrders: OfflineOrders }) {
  return (
    <>
      <span className="rounded border-2 border-ink-900 px-2 text-base font-semibold">Refused: {o.lastError?.message ?? 'the server said no'}</span>
      <Button tone="quiet" onClick={() => offlineOrders.retryNow(o.clientOrderId)} aria-label={`Try again ${o.body.customerName}`}>
        Try again
      </Button>
      <Button tone="quiet" onClick={() => void offlineOrders.discard(o.clientOrderId)} aria-label={`Discard ${o.body.customerName}`}>
        Discard
      </Button>
    </>
  );
}

/** A card order taken while the server was away: nothing happens until the cashier chooses. */
interface HeldProps {
  order: OfflineOrder;
  offlineOrders: OfflineOrders;
  money(c: number | null): string | null;
  onNotice(n: string): void;
  onSent?(order: OrderView): void;
}

function Held({ order: o, offlineOrders, money, onNotice, onSent }: HeldProps) {
  const [busy, setBusy] = useState(false);
  const name = o.body.customerName;
  const settle = async (choice: 'card' | 'cash') => {
    setBusy(true);
    const order = await offlineOrders.settleHeld(o.clientOrderId, choice).finally(() => setBusy(false));
    // the card went through on an earlier try after all: the customer must not pay twice
    if (order && choice === 'cash' && order.payment?.method === 'card' && order.paymentStatus === 'paid') {
      onNotice(`${name}’s card was charged ${money(order.totalCents)} before the connection dropped: give the cash back.`);
    }
    if (order) onSent?.(order);
  };
  return (
    <>
      <span className="rounded border-2 border-ink-900 px-2 text-base font-semibold">
        Card not charged{o.lastError && o.attempts > 0 ? ` — ${o.lastError.message}` : ''}
      </span>
      <Button tone="quiet" disabled={busy} onClick={() => void settle('card')} aria-label={`Charge ${name}’s card now`}>
        Charge card now (customer here)
      </Button>
      <Button tone="quiet" disabled={busy} onClick={() => void settle('cash')} aria-label={`${name} paid cash`}>
        They paid cash
      </Button>
      <Button tone="quiet" disabled={busy} onClick={() => void offlineOrders.discard(o.clientOrderId)} aria-label={`Cancel ${name}’s order`}>
        Cancel
      </Button>
    </>
  );
}
