// The Counter: menu tiles, the item sheet, the order, cash and Send.
import { zodResolver } from '@hookform/resolvers/zod';
import { useSuspenseQuery } from '@tanstack/react-query';
import { useCallback, useRef, useState } from 'react';
import { useFieldArray, useForm } from 'react-hook-form';
import type { LoaderFunctionArgs } from 'react-router';
import { formatCents } from '../domain/money';
import { quoteLabel } from '../domain/quote';
import { can } from '../domain/roles';
import { orderDraft, type OrderDraft, type OrderDraftInput, type OrderLineInput } from '../domain/schemas';
import type { MenuItemView, OrderView } from '../domain/types';
import { Button } from '../components/ui/button';
import { LinkStateBadge } from '../components/ui/link-state';
import { StaffMenu } from '../components/ui/staff-menu';
import { barBoardQuery } from '../features/board/queries';
import { useLiveBoard } from '../features/board/use-live-board';
import { emptyCheckout, previewTotals, tenderedCents, type Checkout } from '../features/counter/checkout';
import { CheckoutPanel, SendBar } from '../features/counter/checkout-panel';
import { ItemSheet } from '../features/counter/item-sheet';
import { OrdersDrawer } from '../features/counter/orders-drawer';
import { ReadyStrip } from '../features/counter/ready-strip';
import { MenuGrid } from '../features/counter/menu-grid';
import { OrderPanel } from '../features/counter/order-panel';
import { PendingOrdersBanner } from '../features/counter/pending-orders-banner';
import { usePendingOrders } from '../features/counter/use-pending-orders';
import { useSendOrder } from '../features/counter/use-send-order';
import { WaitNow } from '../features/counter/wait-now';
import { menuQuery } from '../features/menu/queries';
import { sessionQuery } from '../features/session/queries';
import { useApi } from '../lib/api-context';
import { ApiError } from '../lib/http';
import { useLeaveGuard } from '../lib/leave-guard';
import { uuid } from '../lib/uuid';
import { requireScreen, type RouteDeps } from './deps';
import { SCREENS } from '../domain/screens';

type Sheet = { item: MenuItemView; index: number | null } | null;

function Counter() {
  const api = useApi();
  const { data: menu } = useSuspenseQuery(menuQuery(api));
  const { data: board } = useSuspenseQuery(barBoardQuery(api));
  const { data: session } = useSuspenseQuery(sessionQuery(api));
  const link = useLiveBoard();
  const form = useForm<OrderDraftInput, unknown, OrderDraft>({ resolver: zodResolver(orderDraft), defaultValues: BLANK_DRAFT });
  const lines = useFieldArray({ control: form.control, name: 'items' });
  const [sheet, setSheet] = useState<Sheet>(null);
  const [checkout, setCheckout] = useState<Checkout>(emptyCheckout);
  const [sent, setSent] = useState<OrderView | null>(null);
  const [ordersOpen, setOrdersOpen] = useState(false);
  const [orderCount, setOrderCount] = useState(0);
  // One id per order being built: a retry after a lost answer (or a declined card) can't take
  // the order twice.
  const clientOrderId = useRef<string | null>(null);
  const send = useSendOrder();
  const outbox = usePendingOrders(send.mutateAsync);

  const items = form.watch('items');
  useLeaveGuard(items.length > 0 ? `The order being built (${items.length} ${items.length === 1 ? 'item' : 'items'}) has not been sent and will be lost.` : null);
  const totals = previewTotals(menu, items, checkout.discount);
  const queued = board.tickets.filter((t) => t.status === 'open').flatMap((t) => t.drinks.filter((d) => d.status !== 'done'));

  const pick = useCallback(
    (item: MenuItemView) => {
      setSent(null);
      if (item.station === 'counter') lines.append({ menuItemId: item.id });
      else setSheet({ item, index: null });
    },
    [lines],
  );
  const saveLine = useCallback(
    (line: OrderLineInput) => {
      setSheet((current) => {
        if (current?.index !== null && current?.index !== undefined) lines.update(current.index, line);
        else lines.append(line);
        return null;
      });
      form.clearErrors('items');
    },
    [lines, form],
  );
  const closeSheet = useCallback(() => setSheet(null), []);

  const finish = (order: OrderView | null) => {
    setOrderCount((n) => n + 1); // a fresh checkout panel (allergy picker closed) for the next customer
    setSent(order);
    clientOrderId.current = null;
    form.reset(BLANK_DRAFT);
    setCheckout(emptyCheckout);
  };

  const onSubmit = form.handleSubmit(async (draft) => {
    clientOrderId.current ??= uuid();
    const base = {
      clientOrderId: clientOrderId.current,
      ...draft,
      allergyNote: draft.allergyNote || undefined,
      customerEmail: checkout.email.trim() || undefined,
      discount: checkout.discount ?? undefined,
    };
    try {
      if (checkout.method === 'card') {
        // A card is charged while the customer stands there: never queued for later.
        const { order } = await send.mutateAsync({ ...base, payment: { method: 'card', paymentMethod: checkout.paymentMethod! } });
        finish(order);
        return;
      }
      const cash = tenderedCents(checkout, totals.totalCents) ?? 0;
      const result = await outbox.sendOrQueue({ ...base, payment: { method: 'cash', tenderedCents: cash } }, { totalCents: totals.totalCents });
      // kept in this browser and resent by itself: the banner shows it, not an error
      if (result.queued) send.reset();
      // the receipt address travels in the order: the server mails it once the order is in, even
      // when this queue sends it later
      finish(result.queued ? null : result.order);
    } catch {
      /* shown from send.error; the same id is kept for the retry */
    }
  });

  const error = send.error instanceof ApiError ? send.error.message : send.error ? 'Could not send the order' : null;
  const money = (c: number | null) => formatCents(c ?? 0, menu.location.currency);
  return (
    <div className="flex h-screen flex-col bg-steam-50 text-ink-900">
      <header className="flex items-center gap-6 border-b border-steam-200 px-5 py-3">
        <h1 className="text-2xl font-semibold">Counter</h1>
        <span className="hidden text-lg text-ink-600 xl:inline">{menu.location.name}</span>
        <span data-testid="queue-glance" className="text-lg">
          In the queue: <strong>{queued.length}</strong> drink{queued.length === 1 ? '' : 's'}
        </span>
        <WaitNow items={items} />
        <Button tone="quiet" onClick={() => setOrdersOpen(true)}>
          Today’s orders
        </Button>
        <span className="hidden text-sm text-ink-600 xl:inline">Keys: 1–9 tile · Enter add · Esc close</span>
        <LinkStateBadge state={link} className="ml-auto text-base" />
        <StaffMenu />
      </header>
      <PendingOrdersBanner queue={outbox} currency={menu.location.currency} />
      <ReadyStrip tickets={board.tickets} />
      {sent && (
        // over the menu, not above it: the tiles must not jump under the cashier's finger
        <div
          role="status"
          className="fixed bottom-4 left-4 z-10 flex max-w-[calc(100%-30rem)] flex-wrap items-center gap-x-5 gap-y-1 rounded-xl bg-ink-900 px-5 py-3 text-xl text-steam-50 shadow-xl"
        >
          <span>
            Sent <strong>#{sent.number}</strong> for <strong>{sent.customerName}</strong> · {money(sent.totalCents)}{' '}
            {sent.payment.method === 'card' ? '· card paid' : ''}
            {sent.allergens.length > 0 || sent.allergyNote ? ' · ⚠ allergy flagged' : ''}
          </span>
          {sent.payment.method === 'cash' && (
            <span>
              Change due <strong data-testid="sent-change">{money(sent.changeCents)}</strong>
            </span>
          )}
          {sent.quotedWaitSeconds !== null && sent.status === 'open' && (
            <span data-testid="quote">Tell them: {quoteLabel(sent.quotedWaitSeconds)}</span>
          )}
          <a className="underline" href={`/receipts/${sent.id}`} target="_blank" rel="noreferrer">
            Receipt
          </a>
          <a className="underline" href={`/labels/${sent.id}`} target="_blank" rel="noreferrer">
            Cup labels
          </a>
          <Button tone="quiet" className="ml-auto" onClick={() => setSent(null)}>
            OK
          </Button>
        </div>
      )}
      <form onSubmit={onSubmit} noValidate className="grid min-h-0 flex-1 grid-cols-[1fr_26rem] gap-4 p-4">
        <MenuGrid menu={menu} onPick={pick} />
        <aside className="flex min-h-0 flex-col rounded-2xl border border-steam-200 bg-white p-4">
          <div className="min-h-0 flex-1 overflow-y-auto pr-1">
          <OrderPanel
            menu={menu}
            items={items}
            totals={totals}
            error={form.formState.errors.items?.message ?? form.formState.errors.items?.root?.message}
            onEditLine={(index) => {
              const item = menu.items.find((i) => i.id === form.getValues(`items.${index}`).menuItemId);
              if (item && item.station === 'bar') setSheet({ item, index });
            }}
            onRemoveLine={(index) => lines.remove(index)}
          />
          <CheckoutPanel
            key={orderCount}
            menu={menu}
            form={form}
            checkout={checkout}
            onCheckout={setCheckout}
            totalCents={totals.totalCents}
            canDiscount={can(session.user?.role, 'giveDiscounts')}
          />
          </div>
          <SendBar
            menu={menu}
            form={form}
            checkout={checkout}
            onCheckout={setCheckout}
            totalCents={totals.totalCents}
            sending={send.isPending}
            error={error}
          />
        </aside>
      </form>
      {sheet && (
        <ItemSheet
          key={`${sheet.item.id}-${sheet.index}`}
          menu={menu}
          item={sheet.item}
          initial={sheet.index === null ? undefined : form.getValues(`items.${sheet.index}`)}
          onAdd={saveLine}
          onClose={closeSheet}
        />
      )}
      {ordersOpen && <OrdersDrawer canRefund={can(session.user?.role, 'refundOrders')} currency={menu.location.currency} onClose={() => setOrdersOpen(false)} />}
    </div>
  );
}

const BLANK_DRAFT: OrderDraft = { customerName: '', service: 'takeaway', allergens: [], allergyNote: undefined, items: [] };

export const counterRoute = (deps: RouteDeps) => ({
  Component: Counter,
  handle: { title: 'Counter' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.counter.need);
    await Promise.all([
      deps.queryClient.ensureQueryData(menuQuery(deps.api)),
      deps.queryClient.ensureQueryData(barBoardQuery(deps.api)),
    ]);
    return null;
  },
});
