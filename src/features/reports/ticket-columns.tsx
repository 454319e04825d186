// The ticket history's columns. The sortable ones carry the server's sort names as their ids.
import { createColumnHelper, type RowData } from '@tanstack/react-table';
import { formatCents } from '@/domain/money';
import { formatDuration } from '@/domain/format';
import { type TicketHistoryRow } from '@/domain/reports';
import { PAYMENT_METHOD_WORDS, PAYMENT_STATUS_WORDS, TICKET_STATUS_WORDS } from '@/domain/ticket-words';

declare module '@tanstack/react-table' {
  // numeric columns are right-aligned (the generics must match the library's declaration)
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface ColumnMeta<TData extends RowData, TValue> {
    numeric?: boolean;
  }
}

export interface ColumnContext {
  currency: string;
  locale: string;
  timeZone: string;
  targetSeconds: number;
  multiDay: boolean;
}

const col = createColumnHelper<TicketHistoryRow>();

export function ticketColumns(c: ColumnContext) {
  const money = (cents: number) => formatCents(cents, c.currency, c.locale);
  const time = new Intl.DateTimeFormat(
    c.locale,
    c.multiDay ? { dateStyle: 'short', timeStyle: 'short', timeZone: c.timeZone } : { timeStyle: 'short', timeZone: c.timeZone },
  );
  return [
    col.accessor('number', {
      id: 'number',
      header: 'Ticket',
      cell: (i) => <span className="tabular-nums">#{i.getValue()}</span>,
    }),
    col.accessor('customerName', { id: 'customer', header: 'Customer', cell: (i) => <span className="block max-w-56 truncate">{i.getValue()}</span> }),
    col.accessor('createdAt', {
      id: 'createdAt',
      header: 'Taken',
      cell: (i) => (
        <time dateTime={i.getValue()} suppressHydrationWarning className="tabular-nums">
          {time.format(new Date(i.getValue()))}
        </time>
      ),
    }),
    col.accessor('status', { id: 'status', header: 'Status', enableSorting: false, cell: (i) => TICKET_STATUS_WORDS[i.getValue()] }),
    col.accessor('paymentMethod', {
      id: 'payment',
      header: 'Paid by',
      enableSorting: false,
      cell: (i) => {
        const r = i.row.original;
        if (r.paymentStatus === 'unpaid') return <span className="text-ink-600">{PAYMENT_STATUS_WORDS.unpaid}</span>;
        return (
          <>
            {PAYMENT_METHOD_WORDS[r.paymentMethod]}
            {r.refundedCents > 0 && <span className="block text-sm text-ink-600">refunded {money(r.refundedCents)}</span>}
          </>
        );
      },
    }),
    col.accessor('drinks', { id: 'drinks', header: 'Drinks', enableSorting: false, meta: { numeric: true } }),
    col.accessor('totalCents', { id: 'total', header: 'Total', meta: { numeric: true }, cell: (i) => money(i.getValue()) }),
    col.accessor('waitSeconds', {
      id: 'wait',
      header: 'Wait',
      meta: { numeric: true },
      cell: (i) => {
        const w = i.getValue();
        if (w === null) return <span className="text-ink-600">—</span>;
        const over = w > c.targetSeconds;
        return (
          <span className={over ? 'font-semibold' : undefined}>
            {formatDuration(w)}
            {over && <span className="ml-1 text-sm">▲ over</span>}
          </span>
        );
      },
    }),
  ];
}
