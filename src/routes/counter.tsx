// The Counter: menu tiles, the item sheet, the order, cash and Send.
import { zodResolver } from '@hookform/resolvers/zod';
import { useSuspenseQuery } from '@tanstack/react-query';
import { useCallback, useRef, useState } from 'react';
import { useFieldArray, useForm } from 'react-hook-form';
import type { LoaderFunctionArgs } from 'react-router';
import { formatCents } from '@/domain/money';
import { addLine, cupsOf, orderCountLabel } from '@/domain/order-quantity';
import { plural } from '@/domain/plural';
import { quoteLabel } from '@/domain/quote';
import { can } from '@/domain/roles';
import { orderDraft, type CreateOrderBody, type OrderDraft, type OrderDraftInput, type OrderLineInput } from '@/domain/schemas';
import type { MenuItemView, OrderView } from '@/domain/types';
import { Button } from '@/components/ui/button';
import { LinkStateBadge } from '@/components/ui/link-state';
import { StaffMenu } from '@/features/team/staff-menu';
import { barBoardQuery } from '@/queries/board';
import { useLiveBoard } from '@/live/use-live-board';
import { emptyCheckout, previewTotals, splitParts, tenderedCents, tipCentsOf, type Checkout } from '@/features/counter/checkout';
import { TipPicker } from '@/features/counter/tip-picker';
import { amountDueCents, maxTipCents, TIPS_OFF } from '@/domain/tips';
import { CheckoutPanel, PaymentPanel, SendBar } from '@/features/counter/checkout-panel';
import { ItemSheet } from '@/features/counter/item-sheet';
import { OrdersDrawer } from '@/features/counter/orders-drawer';
import { ReadyStrip } from '@/features/counter/ready-strip';
import { MenuGrid } from '@/features/counter/menu-grid';
import { OrderPanel } from '@/features/counter/order-panel';
import { OfflineOrdersBanner } from '@/features/counter/offline-orders-banner';
import { useOfflineOrders } from '@/features/counter/use-offline-orders';
import { useSendOrder } from '@/features/counter/use-send-order';
import { SplitEditor } from '@/features/counter/split-editor';
import { useWide } from '@/lib/use-wide';
import { WaitNow } from '@/features/counter/wait-now';
import { menuQuery } from '@/queries/menu';
import { sessionQuery } from '@/queries/session';
import { useApi } from '@/lib/api-context';
import { ApiError } from '@/lib/http';
import { useLeaveGuard } from '@/lib/leave-guard';
import { cn } from '@/lib/cn';
import { uuid } from '@/lib/uuid';
import { requireScreen, type RouteDeps } from './deps';
import { SCREENS } from '@/domain/screens';

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
  // On a phone the menu and the order take turns on the screen; wider, they stand side by side.
  const [phoneView, setPhoneView] = useState<'menu' | 'order'>('menu');
  const orderScroll = useRef<HTMLDivElement>(null);
  // One id per order being built: a retry after a lost answer (or a declined card) can't take
  // the order twice.
  const clientOrderId = useRef<string | null>(null);
  const send = useSendOrder();
  const offlineOrders = useOfflineOrders(send.mutateAsync);

  const items = form.watch('items');
  useLeaveGuard(items.length > 0 ? `The order being built (${plural(cupsOf(items), 'item')}) has not been sent and will be lost.` : null);
  const totals = previewTotals(menu, items, checkout.discount);
  const tips = menu.location.tips ?? TIPS_OFF;
  // the tip is on top of the order's total (never taxed); what the customer pays is both
  const tipCents = tips.on ? tipCentsOf(checkout.tip, totals.totalCents) : 0;
  const tipOk = tipCents !== null && tipCents <= maxTipCents(totals.totalCents);
  const dueCents = amountDueCents(totals.totalCents, tipCents ?? 0);
  const wide = useWide();
  const [menuWhileSplit, setMenuWhileSplit] = useState(false);
  const splitOnLeft = wide && checkout.method === 'split' && !menuWhileSplit;
  const splitEditor = <SplitEditor checkout={checkout} onCheckout={setCheckout} dueCents={dueCents} currency={menu.location.currency} />;
  const queued = board.tickets.filter((t) => t.status === 'open').flatMap((t) => t.drinks.filter((d) => d.status !== 'done'));

  const pick = useCallback(
    (item: MenuItemView) => {
      setSent(null);
      // the same item again is one more on its line ("3 × Long black"), not another line
      if (item.station === 'counter') lines.replace(addLine(menu, form.getValues('items'), { menuItemId: item.id }));
      else setSheet({ item, index: null });
    },
    [lines, form, menu],
  );
  const saveLine = useCallback(
    (line: OrderLineInput) => {
      const index = sheet?.index ?? null;
      if (index !== null) lines.update(index, { ...line, quantity: form.getValues(`items.${index}`).quantity });
      else lines.replace(addLine(menu, form.getValues('items'), line));
      setSheet(null);
      form.clearErrors('items');
    },
    [lines, form, menu, sheet],
  );
  const closeSheet = useCallback(() => setSheet(null), []);

  const finish = (order: OrderView | null) => {
    setOrderCount((n) => n + 1); // a fresh checkout panel (allergy picker closed) for the next customer
    setSent(order);
    clientOrderId.current = null;
    form.reset(BLANK_DRAFT);
    setCheckout(emptyCheckout);
    setMenuWhileSplit(false);
    // the next customer's order starts at the top, with the menu in front on a phone
    for (const box of [orderScroll.current, orderScroll.current?.firstElementChild]) box?.scrollTo({ top: 0 });
    setPhoneView('menu');
  };

  const onSubmit = form.handleSubmit(async (draft) => {
    clientOrderId.current ??= uuid();
    const base = {
      clientOrderId: clientOrderId.current,
      ...draft,
      allergyNote: draft.allergyNote || undefined,
      customerEmail: checkout.email.trim() || undefined,
      discount: checkout.discount ?? undefined,
      tipCents: tipCents ? tipCents : undefined,
    };
    try {
      const split = checkout.method === 'split' ? splitParts(checkout.split, dueCents) : null;
      const payment: CreateOrderBody['payment'] =
        split && 'parts' in split
          ? { method: 'split', parts: split.parts }
          : checkout.method === 'card'
            ? { method: 'card', paymentMethod: checkout.paymentMethod! }
            : { method: 'cash', tenderedCents: tenderedCents(checkout, dueCents) ?? 0 };
      // Cash that can't reach the server is kept and resent by itself. A card is charged only
      // with the customer there: one that can't reach the server is held, and the banner asks
      // the cashier (charge it now, they paid cash, or cancel) — never charged on its own.
      const result = await offlineOrders.sendOrQueue({ ...base, payment }, { totalCents: dueCents });
      if (result.queued) send.reset();
      // the receipt address travels in the order: the server mails it once the order is in, even
      // when it is sent later as an offline order
      finish(result.queued ? null : result.order);
    } catch (err) {
      // shown from send.error; the same id is kept for the retry. A split says which parts the
      // server took before a card was declined: those stay as they were, marked paid.
      const paidParts = err instanceof ApiError ? (err.details as { paidParts?: unknown } | undefined)?.paidParts : undefined;
      if (Array.isArray(paidParts)) setCheckout((c) => ({ ...c, paidParts: paidParts.filter((n): n is number => typeof n === 'number') }));
    }
  });

  // the server's reasons in its own sentences ("A name for the cup is at most 40 characters")
  const error =
    send.error instanceof ApiError
      ? // details are field messages on a 400, and other facts (an order id) on other refusals
        [send.error.message, ...(Array.isArray(send.error.details) ? send.error.details.map((d) => d.message) : [])].join(' — ')
      : send.error
        ? 'Could not send the order'
        : null;
  const money = (c: number | null) => formatCents(c ?? 0, menu.location.currency);
  return (
    <div className="flex h-dvh flex-col overflow-x-hidden bg-steam-50 text-ink-900">
      {/* one line from a 1024 tablet up; narrower it wraps between whole controls, never inside one */}
      <header className="relative flex flex-wrap items-center gap-x-5 gap-y-2 border-b border-steam-200 px-3 py-2 whitespace-nowrap md:px-5 md:py-3 lg:flex-nowrap">
        <h1 className="text-2xl font-semibold">Counter</h1>
        <span className="hidden text-lg text-ink-600 2xl:inline">{menu.location.name}</span>
        <span data-testid="queue-glance" className="text-lg">
          <span className="hidden lg:inline">In the queue: </span>
          <strong>{queued.length}</strong> {plural(queued.length, 'drink').replace(/^\d+ /, '')}
          <span className="lg:hidden"> queued</span>
        </span>
        <WaitNow items={items} />
        <Button tone="quiet" className="max-md:order-last" onClick={() => setOrdersOpen(true)}>
          Today’s orders
        </Button>
        <span className="hidden text-sm text-ink-600 2xl:inline">Keys: 1–9 tile · Enter add · Esc close</span>
        <LinkStateBadge state={link} className="ml-auto text-base whitespace-normal" />
        <div className="hidden lg:block">
          <StaffMenu />
        </div>
        {/* narrower than a 1024 tablet: the other screens, the person and sign out fold away behind one button */}
        <details className="max-md:order-last lg:hidden">
          <summary className="flex min-h-11 cursor-pointer items-center rounded-lg border border-steam-200 bg-steam-100 px-4 font-semibold">Staff ☰</summary>
          <div className="absolute right-2 left-2 z-30 mt-2 rounded-xl border border-steam-200 bg-white p-3 shadow-xl">
            <StaffMenu />
          </div>
        </details>
      </header>
      <OfflineOrdersBanner offlineOrders={offlineOrders} currency={menu.location.currency} onSent={setSent} />
      <ReadyStrip tickets={board.tickets} />
      {sent && (
        // over the menu, not above it: the tiles must not jump under the cashier's finger
        <div
          role="status"
          className="fixed right-2 bottom-2 left-2 z-10 flex flex-wrap items-center gap-x-5 gap-y-1 rounded-xl bg-ink-900 px-5 py-3 text-xl text-steam-50 shadow-xl md:right-auto md:bottom-4 md:left-4 md:max-w-[calc(100%-30rem)]"
        >
          <span>
            Sent <strong>#{sent.number}</strong> for <strong>{sent.customerName}</strong> · {money(amountDueCents(sent.totalCents, sent.tipCents ?? 0))}
            {sent.tipCents ? ` with ${money(sent.tipCents)} tip` : ''}{' '}
            {sent.payment.method === 'card' ? '· card paid' : sent.payment.method === 'split' ? `· paid in ${sent.payment.parts.length} parts` : ''}
            {sent.allergens.length > 0 || sent.allergyNote ? ' · ⚠ allergy flagged' : ''}
          </span>
          {sent.payment.method !== 'card' && sent.changeCents !== null && (
            <span>
              Change due <strong data-testid="sent-change">{money(sent.changeCents)}</strong>
            </span>
          )}
          {sent.quotedWaitSeconds !== null && sent.status === 'open' && <span data-testid="quote">Tell them: {quoteLabel(sent.quotedWaitSeconds)}</span>}
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
      <form
        onSubmit={onSubmit}
        noValidate
        className="grid min-h-0 flex-1 grid-cols-1 gap-3 p-2 md:grid-cols-[1fr_22rem] md:gap-4 md:p-4 lg:grid-cols-[1fr_28rem]"
      >
        <div className={cn('min-h-0 min-w-0 flex-col', phoneView === 'menu' ? 'flex' : 'hidden', 'md:flex')}>
          {/* from a tablet up the parts of a split take the menu's place: the payment column has no room for them at 768 px high */}
          {splitOnLeft ? (
            <div className="min-h-0 flex-1 overflow-y-auto">
              <div className="mb-2 flex items-center gap-3">
                <h2 className="text-2xl font-semibold">Paying in parts · {money(dueCents)}</h2>
                <Button tone="quiet" className="ml-auto" onClick={() => setMenuWhileSplit(true)}>
                  Show the menu
                </Button>
              </div>
              {splitEditor}
            </div>
          ) : (
            <MenuGrid menu={menu} onPick={pick} />
          )}
          {/* a phone: the order is one tap away, with its count and total on the button */}
          <Button size="lg" className="mt-2 w-full shrink-0 md:hidden" onClick={() => setPhoneView('order')}>
            Order · {orderCountLabel(menu, items)} · {money(totals.totalCents)} ›
          </Button>
        </div>
        <aside
          aria-label="Order and payment"
          className={cn(
            'min-h-0 min-w-0 flex-col rounded-2xl border border-steam-200 bg-white p-3 md:p-4',
            phoneView === 'order' ? 'flex' : 'hidden',
            'md:flex',
          )}
        >
          <Button tone="quiet" className="mb-2 self-start md:hidden" onClick={() => setPhoneView('menu')}>
            ‹ Menu
          </Button>
          {/* a phone scrolls the order and payment as one (Send stays pinned); wider, the lines (at least a line and a half, with its − / +)
              scroll on their own and the payment choices stay in view under them */}
          <div ref={orderScroll} className="min-h-0 flex-1 overflow-y-auto md:flex md:flex-col">
            <div className="pr-1 md:min-h-32 md:flex-1 md:overflow-y-auto">
              <OrderPanel
                menu={menu}
                items={items}
                totals={totals}
                error={form.formState.errors.items?.message ?? form.formState.errors.items?.root?.message}
                onEditLine={(index) => {
                  const item = menu.items.find((i) => i.id === form.getValues(`items.${index}`).menuItemId);
                  if (item && item.station === 'bar') setSheet({ item, index });
                }}
                onQuantity={(index, quantity) => (quantity < 1 ? lines.remove(index) : lines.update(index, { ...form.getValues(`items.${index}`), quantity }))}
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
            <PaymentPanel
              key={`pay-${orderCount}`}
              menu={menu}
              form={form}
              checkout={checkout}
              onCheckout={setCheckout}
              totalCents={dueCents}
              split={
                wide ? (
                  <p className="text-lg">
                    The parts are on the left.{' '}
                    {menuWhileSplit && (
                      <Button tone="quiet" onClick={() => setMenuWhileSplit(false)}>
                        Show the parts
                      </Button>
                    )}
                  </p>
                ) : (
                  splitEditor
                )
              }
              tipPicker={
                tips.on && (
                  <TipPicker
                    tips={tips}
                    tip={checkout.tip}
                    tipCents={tipCents}
                    totalCents={totals.totalCents}
                    currency={menu.location.currency}
                    onChange={(tip) => setCheckout({ ...checkout, tip })}
                  />
                )
              }
            />
          </div>
          <SendBar
            menu={menu}
            form={form}
            checkout={checkout}
            onCheckout={setCheckout}
            totalCents={dueCents}
            sending={send.isPending}
            tipOk={tipOk}
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
      {ordersOpen && (
        <OrdersDrawer
          canRefund={can(session.user?.role, 'refundOrders')}
          canRemake={can(session.user?.role, 'remakeDrinks')}
          currency={menu.location.currency}
          onClose={() => setOrdersOpen(false)}
        />
      )}
    </div>
  );
}

const BLANK_DRAFT: OrderDraft = { customerName: '', service: 'takeaway', allergens: [], allergyNote: undefined, items: [] };

export const counterRoute = (deps: RouteDeps) => ({
  Component: Counter,
  handle: { title: 'Counter' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.counter.need);
    await Promise.all([deps.queryClient.ensureQueryData(menuQuery(deps.api)), deps.queryClient.ensureQueryData(barBoardQuery(deps.api))]);
    return null;
  },
});
