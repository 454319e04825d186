// The rows of an uploaded menu file as the import would take them: what each row would do, and
// for a bad row the word "Problem", the cell marked, and what to fix written beside it.
import { ScrollBox } from '@/components/ui/scroll-box';
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { useMemo } from 'react';
import { MENU_CSV_COLUMNS, type MenuCsvColumn, type MenuImportPreview, type RowAction, type RowError } from '@/domain/menu-csv';
import { cn } from '@/lib/cn';

type PreviewRow = MenuImportPreview['rows'][number] & { problems: RowError[] };

const RESULT: Record<RowAction, string> = { add: 'Add', update: 'Update', unchanged: 'No change' };
const th = 'sticky top-0 border-b-2 border-steam-200 bg-white px-2 py-2 text-left text-sm font-semibold tracking-wide whitespace-nowrap text-ink-600';
const td = 'border-b border-steam-100 px-2 py-1.5 align-top';

const column = createColumnHelper<PreviewRow>();

function cellColumn(name: MenuCsvColumn) {
  return column.accessor((r) => r.cells[name], {
    id: name,
    header: name,
    cell: (info) => {
      const bad = info.row.original.problems.some((p) => p.column === name);
      const text = info.getValue();
      if (!bad) return text;
      return (
        <span className="inline-block rounded border-2 border-copper-700 bg-white px-1 font-semibold whitespace-nowrap text-ink-900">
          <span aria-hidden>⚠ </span>
          {text === '' ? '(empty)' : text}
          <span className="sr-only"> (problem)</span>
        </span>
      );
    },
  });
}

const columns = [
  column.accessor('row', { header: 'Row', cell: (info) => info.getValue() }),
  column.display({
    id: 'result',
    header: 'Result',
    cell: ({ row }) =>
      row.original.problems.length > 0 ? (
        <span className="font-semibold whitespace-nowrap text-copper-700">⚠ Problem</span>
      ) : (
        <span className="whitespace-nowrap">{row.original.action ? RESULT[row.original.action] : '—'}</span>
      ),
  }),
  column.display({
    id: 'fix',
    header: 'What to fix',
    cell: ({ row }) => (
      <ul className="min-w-72 space-y-0.5">
        {row.original.problems.map((p, i) => (
          <li key={i}>
            {p.column && <span className="font-semibold">{p.column}: </span>}
            {p.message}
          </li>
        ))}
      </ul>
    ),
  }),
  ...MENU_CSV_COLUMNS.map(cellColumn),
];

export function PreviewTable({ preview }: { preview: MenuImportPreview }) {
  const data = useMemo(() => {
    const byRow = new Map<number, RowError[]>();
    for (const e of preview.errors) byRow.set(e.row, [...(byRow.get(e.row) ?? []), e]);
    return preview.rows.map((r) => ({ ...r, problems: byRow.get(r.row) ?? [] }));
  }, [preview]);
  // a file without problems needs no empty "What to fix" column
  const shown = useMemo(() => (preview.errors.length > 0 ? columns : columns.filter((c) => c.id !== 'fix')), [preview]);
  const table = useReactTable({ data, columns: shown, getCoreRowModel: getCoreRowModel(), getRowId: (r) => String(r.row) });

  return (
    <div className="max-h-[32rem] overflow-auto rounded-lg border border-steam-200 bg-white">
      <ScrollBox label="Import preview table">
        <table className="w-full text-base" data-testid="import-preview">
          <caption className="sr-only">Rows of {preview.fileName} as the import would take them</caption>
          <thead>
            {table.getHeaderGroups().map((g) => (
              <tr key={g.id}>
                {g.headers.map((h) => (
                  <th key={h.id} scope="col" className={th}>
                    {flexRender(h.column.columnDef.header, h.getContext())}
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => {
              const bad = row.original.problems.length > 0;
              return (
                <tr key={row.id} data-testid="import-row" data-row={row.original.row} data-problem={bad ? 'yes' : 'no'} className={cn(bad && 'bg-steam-100')}>
                  {row.getVisibleCells().map((cell) => (
                    <td
                      key={cell.id}
                      className={cn(
                        td,
                        cell.column.id === 'row' && 'text-right tabular-nums',
                        bad && cell.column.id === 'row' && 'border-l-4 border-l-copper-700',
                      )}
                    >
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              );
            })}
          </tbody>
        </table>
      </ScrollBox>
    </div>
  );
}
