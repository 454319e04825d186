// The Counter: menu tiles, the item sheet, the order, cash and Send.
import { zodResolver } from '@hookform/resolvers/zod';
import { useSuspenseQuery } from '@tanstack/react-query';
import { useRef, useState } from 'react';
import { useFieldArray, useForm } from 'react-hook-form';
import type { LoaderFunctionArgs } from 'react-router';
import { formatCents, orderTotals, parseAmountToCents } from '../domain/money';
import { resolveLine } from '../domain/order-lines';
import { orderDraft, type OrderDraft, type OrderLineInput } from '../domain/schemas';
import type { MenuItemView, OrderView } from '../domain/types';
import { Button } from '../components/ui/button';
import { LinkStateBadge } from '../components/ui/link-state';
import { barBoardQuery } from '../features/board/queries';
import { useLiveBoard } from '../features/board/use-live-board';
import { ItemSheet } from '../features/counter/item-sheet';
import { MenuGrid } from '../features/counter/menu-grid';
import { OrderPanel } from '../features/counter/order-panel';
import { useSendOrder } from '../features/counter/use-send-order';
import { menuQuery } from '../features/menu/queries';
import { useApi } from '../lib/api-context';
import { ApiError } from '../lib/http';
import { uuid } from '../lib/uuid';
import { requireScreen, type RouteDeps } from './deps';

type Sheet = { item: MenuItemView; index: number | null } | null;

function Counter() {
  const api = useApi();
  const { data: menu } = useSuspenseQuery(menuQuery(api));
  const { data: board } = useSuspenseQuery(barBoardQuery(api));
  const link = useLiveBoard();
  const form = useForm<OrderDraft>({ resolver: zodResolver(orderDraft), defaultValues: { customerName: '', items: [] } });
  const lines = useFieldArray({ control: form.control, name: 'items' });
  const [sheet, setSheet] = useState<Sheet>(null);
  const [tendered, setTendered] = useState('');
  const [sent, setSent] = useState<OrderView | null>(null);
  // One id per order being built: a retry after a lost answer can't take the order twice.
  const clientOrderId = useRef<string | null>(null);
  const send = useSendOrder();

  const queued = board.tickets.filter((t) => t.status === 'open').flatMap((t) => t.drinks.filter((d) => d.status !== 'done'));

  const pick = (item: MenuItemView) => {
    setSent(null);
    if (item.station === 'counter') lines.append({ menuItemId: item.id });
    else setSheet({ item, index: null });
  };
  const saveLine = (line: OrderLineInput) => {
    if (sheet?.index !== null && sheet?.index !== undefined) lines.update(sheet.index, line);
    else lines.append(line);
    form.clearErrors('items');
    setSheet(null);
  };

  const onSubmit = form.handleSubmit(async (draft) => {
    const exact = orderTotals(
      draft.items.map((l) => {
        const r = resolveLine(menu, l);
        return r.ok ? r.line.priceCents : 0;
      }),
      menu.location,
    ).totalCents;
    // blank means the customer paid exactly; the server checks it covers its own total
    const tenderedCents = tendered.trim() === '' ? exact : (parseAmountToCents(tendered) ?? 0);
    clientOrderId.current ??= uuid();
    try {
      const { order } = await send.mutateAsync({
        clientOrderId: clientOrderId.current,
        ...draft,
        payment: { method: 'cash', tenderedCents },
      });
      setSent(order);
      clientOrderId.current = null;
      form.reset({ customerName: '', items: [] });
      setTendered('');
    } catch {
      /* shown from send.error; the same id is kept for the retry */
    }
  });

  const error = send.error instanceof ApiError ? send.error.message : send.error ? 'Could not send the order' : null;
  return (
    <div className="flex h-screen flex-col bg-steam-50 text-ink-900">
      <header className="flex items-center gap-6 border-b border-steam-200 px-5 py-3">
        <h1 className="text-2xl font-semibold">Counter</h1>
        <span className="text-lg text-ink-600">{menu.location.name}</span>
        <span data-testid="queue-glance" className="text-lg">
          In the queue: <strong>{queued.length}</strong> drink{queued.length === 1 ? '' : 's'}
        </span>
        <LinkStateBadge state={link} className="ml-auto text-base" />
      </header>
      {sent && (
        <div role="status" className="flex items-center gap-4 bg-ink-900 px-5 py-3 text-xl text-steam-50">
          <span>
            Sent <strong>#{sent.number}</strong> for <strong>{sent.customerName}</strong> · {formatCents(sent.totalCents, menu.location.currency)}
          </span>
          <span>
            Change due <strong data-testid="sent-change">{formatCents(sent.changeCents, menu.location.currency)}</strong>
          </span>
          <Button tone="quiet" className="ml-auto" onClick={() => setSent(null)}>
            OK
          </Button>
        </div>
      )}
      <form onSubmit={onSubmit} noValidate className="grid min-h-0 flex-1 grid-cols-[1fr_24rem] gap-4 p-4">
        <MenuGrid menu={menu} onPick={pick} />
        <OrderPanel
          menu={menu}
          form={form}
          tendered={tendered}
          onTendered={setTendered}
          onEditLine={(index) => {
            const item = menu.items.find((i) => i.id === form.getValues(`items.${index}`).menuItemId);
            if (item && item.station === 'bar') setSheet({ item, index });
          }}
          onRemoveLine={(index) => lines.remove(index)}
          sending={send.isPending}
          error={error}
        />
      </form>
      {sheet && (
        <ItemSheet
          key={`${sheet.item.id}-${sheet.index}`}
          menu={menu}
          item={sheet.item}
          initial={sheet.index === null ? undefined : form.getValues(`items.${sheet.index}`)}
          onAdd={saveLine}
          onClose={() => setSheet(null)}
        />
      )}
    </div>
  );
}

export const counterRoute = (deps: RouteDeps) => ({
  Component: Counter,
  handle: { title: 'Counter' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, 'takeOrders');
    await Promise.all([
      deps.queryClient.ensureQueryData(menuQuery(deps.api)),
      deps.queryClient.ensureQueryData(barBoardQuery(deps.api)),
    ]);
    return null;
  },
});
