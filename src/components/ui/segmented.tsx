import { cn } from '@/lib/cn';

interface Option<T> {
  value: T;
  label: string;
  hint?: string;
}

/** A row of big choice buttons for touch; one is chosen (a radio group for assistive tech). */
export function Segmented<T extends string | number>({
  label,
  options,
  value,
  onChange,
}: {
  label: string;
  options: Option<T>[];
  value: T | undefined;
  onChange(v: T): void;
}) {
  return (
    <fieldset>
      <legend className="mb-1 text-sm font-semibold tracking-widest text-ink-600 uppercase">{label}</legend>
      <div role="radiogroup" aria-label={label} className="flex flex-wrap gap-2">
        {options.map((o) => {
          const selected = o.value === value;
          return (
            <button
              key={String(o.value)}
              type="button"
              role="radio"
              aria-checked={selected}
              onClick={() => onChange(o.value)}
              className={cn(
                'flex min-h-14 min-w-20 flex-col items-center justify-center rounded-lg border-2 px-4 text-lg font-semibold',
                selected ? 'border-ink-900 bg-ink-900 text-steam-50' : 'border-steam-200 bg-white text-ink-900',
              )}
            >
              <span>
                {selected && <span aria-hidden>✓ </span>}
                {o.label}
              </span>
              {o.hint && <span className={cn('text-sm font-medium', selected ? 'text-steam-200' : 'text-ink-600')}>{o.hint}</span>}
            </button>
          );
        })}
      </div>
    </fieldset>
  );
}
