// A printable receipt (80 mm roll) for one order.
import { Fragment } from 'react';
import { useSuspenseQuery } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router';
import { formatCents } from '@/domain/money';
import { groupOrderLines } from '@/domain/order-quantity';
import { soldLines } from '@/domain/remakes';
import { amountDueCents } from '@/domain/tips';
import { Button } from '@/components/ui/button';
import { menuQuery } from '@/queries/menu';
import { orderQuery } from '@/queries/orders';
import { useApi } from '@/lib/api-context';
import { orNotFound, orderIdFrom, requireScreen, type RouteDeps } from './deps';
import { SCREENS } from '@/domain/screens';

function Receipt() {
  const api = useApi();
  const id = Number(useParams().id);
  const { data } = useSuspenseQuery(orderQuery(api, id));
  const { data: menu } = useSuspenseQuery(menuQuery(api));
  const o = data.order;
  const money = (c: number) => formatCents(c, menu.location.currency);
  const when = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short', timeZone: menu.location.timeZone }).format(new Date(o.createdAt));
  return (
    <main className="mx-auto max-w-[80mm] bg-white p-4 font-sans text-ink-900 print:p-0">
      <Button className="mb-4 w-full print:hidden" onClick={() => window.print()}>
        Print
      </Button>
      <h1 className="text-center text-xl font-semibold">{menu.location.name}</h1>
      <p className="text-center text-sm">{when}</p>
      <p className="mt-2 text-center font-display text-4xl font-semibold">#{o.number}</p>
      <p className="text-center">
        {o.customerName} · {o.service === 'dine_in' ? 'Here' : 'To go'}
      </p>
      <table className="mt-3 w-full text-sm">
        <tbody>
          {groupOrderLines(soldLines(o.lines)).map(({ line: l, quantity, totalCents }) => (
            <tr key={l.id} className="align-top">
              <td className="py-1">
                {quantity > 1 ? `${quantity} × ` : ''}
                {l.itemName}
                {l.sizeName ? ` (${l.sizeName})` : ''}
                <div className="text-xs text-ink-600">{[l.milkName, ...l.extras].filter(Boolean).join(', ')}</div>
              </td>
              <td className="py-1 text-right">{money(totalCents)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <dl className="mt-2 grid grid-cols-2 border-t border-ink-900 pt-2 text-sm">
        <dt>Subtotal</dt>
        <dd className="text-right">{money(o.subtotalCents)}</dd>
        {o.discountCents > 0 && (
          <>
            <dt>Discount ({o.discountReason})</dt>
            <dd className="text-right">−{money(o.discountCents)}</dd>
          </>
        )}
        <dt>Tax{menu.location.taxMode === 'inclusive' ? ' included' : ''}</dt>
        <dd className="text-right">{money(o.taxCents)}</dd>
        <dt className="text-base font-semibold">Total</dt>
        <dd className="text-right text-base font-semibold">{money(o.totalCents)}</dd>
        {o.tipCents > 0 && (
          // outside the total: the tip is never taxed or discounted
          <>
            <dt>Tip</dt>
            <dd className="text-right">{money(o.tipCents)}</dd>
            <dt className="text-base font-semibold">Amount paid</dt>
            <dd className="text-right text-base font-semibold">{money(amountDueCents(o.totalCents, o.tipCents))}</dd>
          </>
        )}
        {o.payment.method === 'split' ? (
          o.payment.parts.map((p) => (
            <Fragment key={p.part}>
              <dt>
                Part {p.part} · {p.method === 'card' ? 'card' : 'cash'}
              </dt>
              <dd className="text-right">{money(p.amountCents)}</dd>
            </Fragment>
          ))
        ) : (
          <>
            <dt>{o.payment.method === 'card' ? 'Card' : 'Cash'}</dt>
            <dd className="text-right">{money(o.payment.tenderedCents ?? amountDueCents(o.totalCents, o.tipCents))}</dd>
          </>
        )}
        {o.payment.method !== 'card' && o.payment.tenderedCents !== null && (
          <>
            <dt>Change</dt>
            <dd className="text-right">{money(o.changeCents ?? 0)}</dd>
          </>
        )}
        {o.refundedCents > 0 && (
          <>
            <dt>Refunded</dt>
            <dd className="text-right">−{money(o.refundedCents)}</dd>
          </>
        )}
      </dl>
      {o.payment.providerId && <p className="mt-2 text-xs">Card payment ref {o.payment.providerId}</p>}
      {menu.location.receiptFooter && <p className="mt-3 text-center text-sm">{menu.location.receiptFooter}</p>}
    </main>
  );
}

export const receiptRoute = (deps: RouteDeps) => ({
  Component: Receipt,
  handle: { title: 'Receipt' },
  loader: async ({ request, params }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.receipt.need);
    const id = orderIdFrom(params);
    await Promise.all([orNotFound(deps.queryClient.ensureQueryData(orderQuery(deps.api, id))), deps.queryClient.ensureQueryData(menuQuery(deps.api))]);
    return null;
  },
});
