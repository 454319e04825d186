// The owner's lots: days since roast, freshness, what is left, when it runs out, which grinder.
// TanStack Table sorting in the browser: a café has a handful of lots, all sent at once.
import { ScrollBox } from '@/components/ui/scroll-box';
import { createColumnHelper, flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { HOPPER_LABEL, type BeanLotView } from '@/domain/bean-stock';
import { Button } from '@/components/ui/button';
import { cn } from '@/lib/cn';
import { FreshnessBadge, StockBadge } from './badges';
import { dateText, gramsText, runsOutText } from './format';

const th = 'border-b-2 border-steam-200 px-3 py-2 text-left text-sm font-semibold tracking-wide text-ink-600 uppercase';
const td = 'border-b border-steam-100 px-3 py-2 align-top';

const col = createColumnHelper<BeanLotView>();

interface Context {
  timeZone: string;
  locale: string;
  onEdit(lot: BeanLotView): void;
  onRetire(lot: BeanLotView): void;
}

function columns(c: Context) {
  return [
    col.accessor('name', {
      header: 'Lot',
      cell: ({ row: { original: l } }) => (
        <div>
          <p className="text-lg font-semibold">{l.name}</p>
          <p className="text-ink-600">
            {l.roaster}
            {l.origin && ` · ${l.origin}`}
          </p>
        </div>
      ),
    }),
    col.accessor('daysSinceRoast', {
      header: 'Since roast',
      cell: ({ row: { original: l } }) => (
        <div>
          <p className="font-display text-2xl font-semibold tabular-nums">{l.daysSinceRoast < 0 ? '—' : `${l.daysSinceRoast} d`}</p>
          <p className="text-sm text-ink-600">roasted {dateText(l.roastDate, c.locale)}</p>
        </div>
      ),
    }),
    col.accessor('freshness', {
      header: 'State',
      enableSorting: false,
      cell: ({ row: { original: l } }) => (
        <div className="flex flex-col items-start gap-1">
          {l.retiredAt ? <span className="font-semibold">Retired</span> : <FreshnessBadge state={l.freshness} />}
          <span className="text-sm text-ink-600">
            best days {l.restDays}–{l.bestUntilDays}
          </span>
        </div>
      ),
    }),
    col.accessor('remainingDg', {
      header: 'Left',
      cell: ({ row: { original: l } }) => (
        <div className="flex flex-col items-start gap-1">
          <p className="font-display text-2xl font-semibold tabular-nums" data-testid="remaining">
            {gramsText(Math.max(0, l.remainingDg), c.locale)}
          </p>
          <p className="text-sm text-ink-600">of {gramsText(l.receivedG * 10, c.locale)}</p>
          {!l.retiredAt && <StockBadge state={l.stock} />}
        </div>
      ),
    }),
    col.display({
      id: 'runsOut',
      header: 'Runs out',
      cell: ({ row: { original: l } }) => {
        if (l.retiredAt) return '—';
        const t = runsOutText(l.runsOut, c.timeZone, c.locale);
        return (
          <div>
            <p className="font-semibold" data-testid="runs-out">
              {t.main}
            </p>
            <p className="text-sm text-ink-600">{t.hint}</p>
          </div>
        );
      },
    }),
    col.accessor('hopper', {
      header: 'Grinder',
      cell: ({ row: { original: l } }) => (l.retiredAt ? '—' : <span className="text-lg font-semibold">{HOPPER_LABEL[l.hopper]}</span>),
    }),
    col.display({
      id: 'actions',
      header: () => <span className="sr-only">Actions</span>,
      cell: ({ row: { original: l } }) =>
        l.retiredAt ? null : (
          <div className="flex gap-2">
            <Button tone="quiet" onClick={() => c.onEdit(l)} aria-label={`Edit ${l.name}`}>
              Edit
            </Button>
            <Button tone="quiet" onClick={() => c.onRetire(l)} aria-label={`Retire ${l.name}`}>
              Retire
            </Button>
          </div>
        ),
    }),
  ];
}

export function LotsTable({ lots, showRetired, ...context }: Context & { lots: BeanLotView[]; showRetired: boolean }) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const { onEdit, onRetire, timeZone, locale } = context;
  const cols = useMemo(() => columns({ onEdit, onRetire, timeZone, locale }), [onEdit, onRetire, timeZone, locale]);
  const data = useMemo(() => (showRetired ? lots : lots.filter((l) => !l.retiredAt)), [lots, showRetired]);
  const table = useReactTable({
    data,
    columns: cols,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getRowId: (l) => String(l.id),
  });
  return (
    <ScrollBox label="Bean lots table">
      <table className="w-full text-base" data-testid="lots-table">
        <thead>
          {table.getHeaderGroups().map((g) => (
            <tr key={g.id}>
              {g.headers.map((h) => {
                const sorted = h.column.getIsSorted();
                return (
                  <th key={h.id} scope="col" className={th} aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}>
                    {h.column.getCanSort() ? (
                      <button
                        type="button"
                        onClick={h.column.getToggleSortingHandler()}
                        className="inline-flex min-h-11 items-center gap-1 uppercase hover:underline"
                      >
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <span aria-hidden>{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}</span>
                      </button>
                    ) : (
                      flexRender(h.column.columnDef.header, h.getContext())
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.length === 0 && (
            <tr>
              <td colSpan={cols.length} className={cn(td, 'text-ink-600')}>
                No lots yet — add the first bag below.
              </td>
            </tr>
          )}
          {table.getRowModel().rows.map((r) => (
            <tr key={r.id} data-testid="lot-row" className={cn(r.original.retiredAt && 'text-ink-600')}>
              {r.getVisibleCells().map((cell) => (
                <td key={cell.id} className={td}>
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollBox>
  );
}
