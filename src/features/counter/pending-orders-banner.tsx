// The strip under the Counter's header while orders wait for the server: how many, whose, how
// much, and a "Send now". Told in words and a shape (the warning sign), never by colour alone.
import { formatCents } from '../../domain/money';
import { Button } from '../../components/ui/button';
import type { PendingOrders } from './use-pending-orders';

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

export function PendingOrdersBanner({ queue, currency }: { queue: PendingOrders; currency: string }) {
  const { pending, resending, retryNow, discard } = queue;
  if (pending.length === 0) return null;
  const waiting = pending.filter((o) => o.state === 'waiting');
  const refused = pending.filter((o) => o.state === 'refused');
  const money = (c: number | null) => (c === null ? null : formatCents(c, currency));

  return (
    <section aria-labelledby="pending-orders-title" data-testid="pending-orders" className="border-b-4 border-alert-deep bg-alert-ink px-5 py-3 text-ink-900">
      <div className="flex flex-wrap items-center gap-4">
        <h2 id="pending-orders-title" className="text-xl font-semibold" aria-live="polite">
          <span aria-hidden className="mr-2">
            ⚠
          </span>
          {waiting.length > 0 && `${plural(waiting.length, 'order')} not sent yet — will send when the server is back`}
          {waiting.length > 0 && refused.length > 0 && ' · '}
          {refused.length > 0 && `${plural(refused.length, 'order')} refused by the server — check and discard`}
        </h2>
        {waiting.length > 0 && (
          <Button tone="quiet" className="ml-auto" disabled={resending} onClick={() => retryNow()}>
            {resending ? 'Sending…' : 'Send now'}
          </Button>
        )}
      </div>
      <ul className="mt-2 flex flex-col gap-1 text-lg" aria-label="Orders not sent yet">
        {pending.map((o) => (
          <li key={o.clientOrderId} data-testid="pending-order" className="flex flex-wrap items-center gap-3">
            <strong>{o.body.customerName}</strong>
            {money(o.totalCents) && <span>{money(o.totalCents)}</span>}
            {o.state === 'waiting' ? (
              <span className="rounded border border-ink-900 px-2 text-base">Not sent yet</span>
            ) : (
              <>
                <span className="rounded border-2 border-ink-900 px-2 text-base font-semibold">Refused: {o.lastError?.message ?? 'the server said no'}</span>
                <Button tone="quiet" onClick={() => retryNow(o.clientOrderId)} aria-label={`Try again ${o.body.customerName}`}>
                  Try again
                </Button>
                <Button tone="quiet" onClick={() => void discard(o.clientOrderId)} aria-label={`Discard ${o.body.customerName}`}>
                  Discard
                </Button>
              </>
            )}
          </li>
        ))}
      </ul>
    </section>
  );
}
