// One category's items: order, name, station, sizes with price, shots, milk, status, actions.
// TanStack Table draws it; the rows come in the menu's own order (the Counter's tile order).
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { useMemo } from 'react';
import { itemStatus, type AdminItem, type AdminMenuView } from '@/domain/menu-admin-view';
import { dgToGramsText } from '@/domain/menu-units';
import { Button } from '@/components/ui/button';
import { cn } from '@/lib/cn';
import { moneyOf } from './format';
import { MoveButtons } from './move-buttons';
import { StatusBadge } from './status';

export interface ItemActions {
  busy: boolean;
  edit(item: AdminItem): void;
  move(item: AdminItem, direction: 'up' | 'down'): void;
  setAvailable(item: AdminItem, available: boolean): void;
  restore(item: AdminItem): void;
}

const col = createColumnHelper<AdminItem>();
const lines = 'flex flex-col gap-1 leading-8';
const liveSizes = (i: AdminItem) => i.sizes.filter((s) => !s.retired);

function columns(menu: AdminMenuView, live: AdminItem[], a: ItemActions) {
  const money = moneyOf(menu);
  const milkName = (id: number | null) => menu.milks.find((m) => m.id === id)?.name ?? '—';
  return [
    col.display({
      id: 'order',
      header: 'Order',
      cell: ({ row: { original: i } }) => {
        const at = live.findIndex((x) => x.id === i.id);
        return i.retired ? null : <MoveButtons name={i.name} first={at === 0} last={at === live.length - 1} busy={a.busy} onMove={(d) => a.move(i, d)} />;
      },
    }),
    col.accessor('name', {
      header: 'Item',
      cell: ({ row: { original: i } }) => (
        <div>
          <p className="text-xl leading-tight font-semibold">{i.name}</p>
          {i.takesMilk && (
            <p className="text-base text-ink-600">
              {milkName(i.defaultMilkId)} milk · {i.texture}
            </p>
          )}
          {i.allergens.length > 0 && <p className="text-base text-ink-600">Contains {i.allergens.join(', ')}</p>}
        </div>
      ),
    }),
    col.accessor('station', { header: 'Station', cell: (c) => (c.getValue() === 'bar' ? 'Bar' : 'Counter') }),
    col.display({
      id: 'sizes',
      header: 'Sizes · price',
      cell: ({ row: { original: i } }) =>
        liveSizes(i).length === 0 ? (
          <span className="tabular-nums">{i.priceCents === null ? '—' : money(i.priceCents)}</span>
        ) : (
          <ul className={lines}>
            {liveSizes(i).map((s) => (
              <li key={s.id} className="whitespace-nowrap">
                {s.name} · <span className="tabular-nums">{money(s.priceCents)}</span>
                {s.isDefault && liveSizes(i).length > 1 && <span className="text-ink-600"> (default)</span>}
              </li>
            ))}
          </ul>
        ),
    }),
    col.display({
      id: 'shots',
      header: 'Shots · dose',
      cell: ({ row: { original: i } }) => (
        <ul className={lines}>
          {liveSizes(i).map((s) => (
            <li key={s.id} className="whitespace-nowrap tabular-nums">
              {s.shots === 0 ? '—' : `${s.shots} · ${dgToGramsText(s.doseDg)} g`}
            </li>
          ))}
        </ul>
      ),
    }),
    col.display({
      id: 'milk',
      header: 'Milk',
      cell: ({ row: { original: i } }) =>
        i.takesMilk ? (
          <ul className={lines}>
            {liveSizes(i).map((s) => (
              <li key={s.id} className="whitespace-nowrap tabular-nums">
                {s.milkMl} ml
              </li>
            ))}
          </ul>
        ) : (
          <span className="whitespace-nowrap text-ink-600">No milk</span>
        ),
    }),
    col.display({ id: 'status', header: 'Status', cell: ({ row: { original: i } }) => <StatusBadge status={itemStatus(i)} /> }),
    col.display({
      id: 'actions',
      header: () => <span className="sr-only">Actions</span>,
      cell: ({ row: { original: i } }) => (
        <div className="flex justify-end gap-2 whitespace-nowrap">
          {i.retired ? (
            <Button tone="quiet" disabled={a.busy} onClick={() => a.restore(i)} aria-label={`Restore ${i.name}`}>
              Restore
            </Button>
          ) : (
            <Button
              tone="quiet"
              disabled={a.busy}
              onClick={() => a.setAvailable(i, !i.available)}
              aria-label={i.available ? `86 ${i.name}` : `Put ${i.name} back on`}
            >
              {i.available ? '86 it' : 'Back on'}
            </Button>
          )}
          <Button tone="quiet" disabled={a.busy} onClick={() => a.edit(i)} aria-label={`Edit ${i.name}`}>
            Edit
          </Button>
        </div>
      ),
    }),
  ];
}

export function ItemsTable({ menu, items, actions }: { menu: AdminMenuView; items: AdminItem[]; actions: ItemActions }) {
  const live = useMemo(() => items.filter((i) => !i.retired), [items]);
  const cols = useMemo(() => columns(menu, live, actions), [menu, live, actions]);
  const table = useReactTable({ data: items, columns: cols, getCoreRowModel: getCoreRowModel(), getRowId: (i) => String(i.id) });
  return (
    <table className="w-full border-collapse text-lg">
      <thead>
        {table.getHeaderGroups().map((g) => (
          <tr key={g.id}>
            {g.headers.map((h) => (
              <th
                key={h.id}
                scope="col"
                className="border-b-2 border-steam-200 px-1.5 py-2 text-left text-sm font-semibold tracking-wide whitespace-nowrap text-ink-600 uppercase lg:px-2"
              >
                {flexRender(h.column.columnDef.header, h.getContext())}
              </th>
            ))}
          </tr>
        ))}
      </thead>
      <tbody>
        {table.getRowModel().rows.map((row) => (
          <tr key={row.id} data-testid="menu-item-row" data-item={row.original.name} className={cn(row.original.retired && 'bg-steam-100 text-ink-600')}>
            {row.getVisibleCells().map((cell) => (
              <td key={cell.id} className="border-b border-steam-200 px-1.5 py-3 align-top lg:px-2">
                {flexRender(cell.column.columnDef.cell, cell.getContext())}
              </td>
            ))}
          </tr>
        ))}
        {items.length === 0 && (
          <tr>
            <td colSpan={cols.length} className="px-2 py-8 text-center text-lg text-ink-600">
              No items in this category yet.
            </td>
          </tr>
        )}
      </tbody>
    </table>
  );
}
