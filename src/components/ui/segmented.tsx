import { cva } from 'class-variance-authority';
import { useId } from 'react';
import { cn } from '@/lib/cn';

interface Option<T> {
  value: T;
  label: string;
  hint?: string;
}

const segmentStyles = cva('flex flex-col items-center justify-center rounded-lg border-2 font-semibold', {
  variants: {
    size: {
      regular: 'min-h-14 min-w-20 px-4 text-lg',
      // as tall, narrower: two choices side by side on a tablet's payment column
      snug: 'min-h-14 min-w-16 px-3 text-lg',
      // buttons share the row's width, however many there are
      compact: 'min-h-12 min-w-0 px-1 text-base leading-tight',
    },
    selected: {
      true: 'border-ink-900 bg-ink-900 text-steam-50',
      false: 'border-steam-200 bg-white text-ink-900',
    },
  },
});

/**
 * A row of big choice buttons for touch; one is chosen (a radio group for assistive tech). The
 * `compact` one is a single row with its word beside it rather than above, for a form that must
 * stay short (the Counter's tip on a 1024×768 tablet).
 */
export function Segmented<T extends string | number>({
  label,
  options,
  value,
  onChange,
  compact = false,
  snug = false,
}: {
  label: string;
  options: Option<T>[];
  value: T | undefined;
  onChange(v: T): void;
  compact?: boolean;
  snug?: boolean;
}) {
  const labelId = useId();
  const buttons = options.map((o) => {
    const selected = o.value === value;
    return (
      <button
        key={String(o.value)}
        type="button"
        role="radio"
        aria-checked={selected}
        onClick={() => onChange(o.value)}
        className={segmentStyles({ size: compact ? 'compact' : snug ? 'snug' : 'regular', selected })}
      >
        <span>
          {selected && <span aria-hidden>✓ </span>}
          {o.label}
        </span>
        {o.hint && <span className={cn('text-sm font-medium', selected ? 'text-steam-200' : 'text-ink-600')}>{o.hint}</span>}
      </button>
    );
  });
  if (compact) {
    return (
      <div className="flex items-center gap-2">
        <span id={labelId} className="min-w-9 shrink-0 text-sm font-semibold tracking-widest text-ink-600 uppercase">
          {label}
        </span>
        <div role="radiogroup" aria-labelledby={labelId} className="grid flex-1 auto-cols-fr grid-flow-col gap-1.5">
          {buttons}
        </div>
      </div>
    );
  }
  return (
    <fieldset>
      <legend className="mb-1 text-sm font-semibold tracking-widest text-ink-600 uppercase">{label}</legend>
      <div role="radiogroup" aria-label={label} className="flex flex-wrap gap-2">
        {buttons}
      </div>
    </fieldset>
  );
}
