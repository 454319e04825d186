// The ticket history: TanStack Table in manual mode, so the server sorts, filters and pages and
// the table only draws. Its state lives in the URL (sort, dir, page, q, status); every change is a
// navigation, and the route's loader fetches the page asked for.
import { ScrollBox } from '@/components/ui/scroll-box';
import { flexRender, getCoreRowModel, useReactTable, type SortingState, type Updater } from '@tanstack/react-table';
import { useEffect, useEffectEvent, useMemo, useRef, useState } from 'react';
import { Form, Link, useNavigate, useSearchParams } from 'react-router';
import { formatCount, TICKET_SORTS, type TicketHistoryPage, type TicketSort } from '@/domain/reports';
import { buttonStyles } from '@/components/ui/button';
import { cn } from '@/lib/cn';
import type { TicketHistoryQuery } from '@/domain/schemas';
import { queryString } from '@/lib/http';
import { tdClass, thClass } from '@/components/report/report-breakdowns';
import { ticketColumns, type ColumnContext } from './ticket-columns';
import { withParams } from './params';
import { plural } from '@/domain/plural';
import { TICKET_STATUS_WORDS } from '@/domain/ticket-words';

/** the status filter's order: where a ticket is in the rush, then the ones set aside */
const STATUS_ORDER = ['open', 'ready', 'collected', 'pending', 'void'] as const;

const field = 'min-h-11 rounded-lg border border-steam-200 bg-white px-3 text-base text-ink-900';

export function TicketTable({ page, params, context }: { page: TicketHistoryPage; params: TicketHistoryQuery; context: ColumnContext }) {
  const [search] = useSearchParams();
  const navigate = useNavigate();
  const go = (changes: Record<string, string | number | undefined>) =>
    navigate({ search: `?${withParams(search, changes)}` }, { replace: true, preventScrollReset: true });

  const sorting: SortingState = [{ id: params.sort, desc: params.dir === 'desc' }];
  const pageCount = Math.max(1, Math.ceil(page.total / page.pageSize));
  const columns = useMemo(() => ticketColumns(context), [context]);
  const table = useReactTable({
    data: page.rows,
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    enableSortingRemoval: false,
    enableMultiSort: false,
    pageCount,
    getRowId: (row) => String(row.id),
    state: { sorting, pagination: { pageIndex: page.page - 1, pageSize: page.pageSize } },
    onSortingChange: (updater: Updater<SortingState>) => {
      const [next] = typeof updater === 'function' ? updater(sorting) : updater;
      if (next && (TICKET_SORTS as readonly string[]).includes(next.id)) go({ sort: next.id as TicketSort, dir: next.desc ? 'desc' : 'asc' });
    },
  });

  // The search box waits for a pause in typing before it asks the server; the pause restarts only
  // when the text changes, not when the page re-renders with a new `go`.
  const searchFor = useEffectEvent(go);
  const [q, setQ] = useState(params.q ?? '');
  const typed = useRef(false);
  useEffect(() => {
    if (!typed.current) return;
    const timer = setTimeout(() => searchFor({ q: q.trim() || undefined }), 350);
    return () => clearTimeout(timer);
  }, [q]); // searchFor is an effect event: never a dependency

  const csvHref = `/api/reports/tickets.csv${queryString({ from: params.from, to: params.to, q: params.q, status: params.status, sort: params.sort, dir: params.dir })}`;
  const pageLink = (n: number) => `?${withParams(search, { page: n === 1 ? undefined : n })}`;
  const first = page.total === 0 ? 0 : (page.page - 1) * page.pageSize + 1;
  const last = Math.min(page.total, page.page * page.pageSize);

  return (
    <section aria-labelledby="tickets-heading" className="rounded-xl border border-steam-200 bg-white p-4">
      <div className="mb-3 flex flex-wrap items-end gap-4">
        <h2 id="tickets-heading" className="mr-auto text-xl font-semibold">
          Tickets
        </h2>
        {/* A GET form, so searching works before the script has loaded; with it, typing is enough. */}
        <Form method="get" className="flex max-w-full flex-wrap items-end gap-2" preventScrollReset onSubmit={() => (typed.current = false)}>
          {['shift', 'from', 'to', 'sort', 'dir'].map((k) => search.get(k) !== null && <input key={k} type="hidden" name={k} value={search.get(k)!} />)}
          <label>
            <span className="block text-sm font-semibold tracking-widest text-ink-600 uppercase">Search</span>
            <input
              type="search"
              name="q"
              value={q}
              onChange={(e) => {
                typed.current = true;
                setQ(e.target.value);
              }}
              placeholder="Name or #number"
              maxLength={40}
              className={cn(field, 'w-56 max-w-full')}
            />
          </label>
          <label>
            <span className="block text-sm font-semibold tracking-widest text-ink-600 uppercase">Status</span>
            <select name="status" value={params.status ?? ''} onChange={(e) => go({ status: e.target.value || undefined })} className={field}>
              <option value="">Any status</option>
              {STATUS_ORDER.map((status) => (
                <option key={status} value={status}>
                  {TICKET_STATUS_WORDS[status]}
                </option>
              ))}
            </select>
          </label>
          <noscript>
            <button type="submit" className={buttonStyles({ tone: 'quiet' })}>
              Filter
            </button>
          </noscript>
        </Form>
        <a href={csvHref} download className={buttonStyles({ tone: 'primary' })} data-testid="tickets-csv">
          Download tickets CSV
        </a>
      </div>

      <ScrollBox label="Tickets table">
        <table className="w-full text-base" data-testid="ticket-table">
          <thead>
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const numeric = header.column.columnDef.meta?.numeric;
                  const sorted = header.column.getIsSorted();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                      className={cn(thClass, numeric && 'text-right')}
                    >
                      {header.column.getCanSort() ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className="inline-flex items-center gap-1 uppercase underline-offset-4 hover:underline"
                        >
                          {flexRender(header.column.columnDef.header, header.getContext())}
                          <span aria-hidden className="w-3 text-ink-900">
                            {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                          </span>
                          {sorted && <span className="sr-only">{sorted === 'asc' ? ', sorted ascending' : ', sorted descending'}</span>}
                        </button>
                      ) : (
                        flexRender(header.column.columnDef.header, header.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} data-testid="ticket-row">
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className={cn(tdClass, cell.column.columnDef.meta?.numeric && 'text-right tabular-nums')}>
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {page.rows.length === 0 && (
              <tr>
                <td colSpan={columns.length} className="px-2 py-6 text-center text-lg text-ink-600">
                  No tickets match.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </ScrollBox>

      <nav aria-label="Ticket pages" className="mt-3 flex items-center gap-3 text-base">
        <span className="mr-auto text-ink-600" data-testid="ticket-count">
          {formatCount(first, context.locale)}–{formatCount(last, context.locale)} of{' '}
          {plural(page.total, 'ticket', 'tickets', formatCount(page.total, context.locale))} · page {formatCount(page.page, context.locale)} of{' '}
          {formatCount(pageCount, context.locale)}
        </span>
        <PageLink to={pageLink(page.page - 1)} enabled={table.getCanPreviousPage()} label="Previous" />
        <PageLink to={pageLink(page.page + 1)} enabled={table.getCanNextPage()} label="Next" />
      </nav>
    </section>
  );
}

function PageLink({ to, enabled, label }: { to: string; enabled: boolean; label: string }) {
  if (!enabled)
    return (
      <span className={cn(buttonStyles({ tone: 'quiet' }), 'cursor-not-allowed opacity-50')} aria-disabled="true">
        {label}
      </span>
    );
  return (
    <Link to={to} replace preventScrollReset className={buttonStyles({ tone: 'quiet' })}>
      {label}
    </Link>
  );
}
