// The header row the side-by-side tables share (Cafés side by side, Day by day): what each row is,
// then the same figures in the same words as the tiles above them. Tips get their column only when
// the rows have any, as the Tips tile shows only then; TipsCell is that column's cell.
import { cn } from '@/lib/cn';
import { thClass } from '@/components/report/report-breakdowns';
import type { TipTotals } from '@/domain/reports';

const FIGURES = ['Orders', 'Drinks', 'Net revenue', 'Half waited under', 'Over target'] as const;

export function FiguresHead({ rowLabel, tips = false }: { rowLabel: string; tips?: boolean }) {
  const figures = tips ? [...FIGURES.slice(0, 3), 'Tips', ...FIGURES.slice(3)] : FIGURES;
  return (
    <thead>
      <tr>
        <th scope="col" className={thClass}>
          {rowLabel}
        </th>
        {figures.map((f) => (
          <th key={f} scope="col" className={cn(thClass, 'text-right')}>
            {f}
          </th>
        ))}
      </tr>
    </thead>
  );
}

/** A row's tips: the total, and how they came (cash, card) below it when there are any. */
export function TipsCell({ tips, money, className }: { tips: TipTotals; money: (cents: number) => string; className: string }) {
  return (
    <td className={className} data-testid="row-tips">
      {money(tips.cents)}
      {tips.cents > 0 && (
        <span className="block text-sm font-normal whitespace-nowrap text-ink-600">
          cash {money(tips.cashCents)} · card {money(tips.cardCents)}
        </span>
      )}
    </td>
  );
}
