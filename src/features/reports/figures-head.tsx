// The header row the side-by-side tables share (Cafés side by side, Day by day): what each row is,
// then the same figures in the same words as the tiles above them.
import { cn } from '@/lib/cn';
import { thClass } from '@/components/report/report-breakdowns';

const FIGURES = ['Orders', 'Drinks', 'Net revenue', 'Half waited under', 'Over target'] as const;

export function FiguresHead({ rowLabel }: { rowLabel: string }) {
  return (
    <thead>
      <tr>
        <th scope="col" className={thClass}>
          {rowLabel}
        </th>
        {FIGURES.map((f) => (
          <th key={f} scope="col" className={cn(thClass, 'text-right')}>
            {f}
          </th>
        ))}
      </tr>
    </thead>
  );
}
