// Form pieces for the editor: a labelled field with its error, allergen tags from the café's
// published list, and a set of checkboxes. Big type, ≥ 44 px targets.
import type { ComponentProps, ReactNode } from 'react';
import { FieldError } from '../../components/ui/field-error';
import { cn } from '../../lib/cn';

export const inputClass = 'min-h-12 w-full rounded-lg border border-steam-200 bg-white px-3 text-lg text-ink-900 aria-invalid:border-copper-700 aria-invalid:border-2';

interface FieldProps extends ComponentProps<'input'> {
  label: string;
  error?: string;
  hint?: ReactNode;
  /** A unit written after the value ("g", "ml"), or a currency sign before it. */
  unit?: string;
  prefix?: string;
}

export function Field({ label, error, hint, unit, prefix, className, id, ...input }: FieldProps) {
  const fieldId = id ?? `f-${input.name}`;
  return (
    <div className={className}>
      <label htmlFor={fieldId} className="mb-1 block text-sm font-semibold tracking-wide text-ink-600 uppercase">
        {label}
      </label>
      <div className="flex items-center gap-2">
        {prefix && <span className="text-lg text-ink-600">{prefix}</span>}
        <input id={fieldId} aria-invalid={error ? true : undefined} aria-describedby={error ? `${fieldId}-error` : undefined} className={inputClass} {...input} />
        {unit && <span className="text-lg text-ink-600">{unit}</span>}
      </div>
      {hint && !error && <p className="mt-1 text-sm text-ink-600">{hint}</p>}
      <FieldError id={`${fieldId}-error`} message={error} />
    </div>
  );
}

interface Choice<T> {
  value: T;
  label: string;
}

/** Checkboxes as tappable chips, each with a tick as well as its colour. */
export function CheckGroup<T extends string | number>({
  legend,
  choices,
  value,
  onChange,
  hint,
  error,
}: {
  legend: string;
  choices: Choice<T>[];
  value: readonly T[];
  onChange(next: T[]): void;
  hint?: string;
  error?: string;
}) {
  const toggle = (v: T) => onChange(value.includes(v) ? value.filter((x) => x !== v) : [...value, v]);
  return (
    <fieldset>
      <legend className="mb-1 text-sm font-semibold tracking-wide text-ink-600 uppercase">{legend}</legend>
      {hint && <p className="mb-2 text-sm text-ink-600">{hint}</p>}
      <div className="flex flex-wrap gap-2">
        {choices.map((c) => {
          const on = value.includes(c.value);
          return (
            <label
              key={String(c.value)}
              className={cn(
                'flex min-h-11 cursor-pointer items-center gap-2 rounded-lg border-2 px-3 text-base font-semibold',
                on ? 'border-ink-900 bg-ink-900 text-steam-50' : 'border-steam-200 bg-white text-ink-900',
              )}
            >
              <input type="checkbox" className="size-5 accent-copper-700" checked={on} onChange={() => toggle(c.value)} />
              {c.label}
            </label>
          );
        })}
        {choices.length === 0 && <p className="text-base text-ink-600">None yet.</p>}
      </div>
      <FieldError message={error} />
    </fieldset>
  );
}

/** The café's published list, named, so tags never come from a home-made list. */
export function AllergenPicker({
  list,
  allergens,
  value,
  onChange,
  hint,
  error,
}: {
  list: 'US' | 'EU';
  allergens: readonly string[];
  value: readonly string[];
  onChange(next: string[]): void;
  hint?: string;
  error?: string;
}) {
  const source = list === 'EU' ? 'EU Regulation 1169/2011, Annex II' : 'US major food allergens (FALCPA, FASTER Act)';
  return (
    <CheckGroup
      legend="Allergens"
      hint={`${hint ? `${hint} ` : ''}From the café's list: ${source}. Check your supplier's labels and your local food code.`}
      choices={allergens.map((a) => ({ value: a, label: a }))}
      value={value}
      onChange={onChange}
      error={error}
    />
  );
}
