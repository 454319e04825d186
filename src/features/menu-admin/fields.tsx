// Form pieces for the editor: a labelled field with its error, a set of checkboxes, and the
// ingredients with the allergens they give on the café's list. Big type, ≥ 44 px targets.
import type { ComponentProps, ReactNode } from 'react';
import type { AllergenList } from '@/domain/allergens';
import { ALLERGEN_CAUTION, allergensFrom, INGREDIENT_GROUPS, ingredientsIn, inOrder, unspecifiedOf } from '@/domain/ingredients';
import { FieldError } from '@/components/ui/field-error';
import { cn } from '@/lib/cn';

/** A field's label: small capitals, as every field of the editor names itself. */
export const labelClass = 'mb-1 block text-sm font-semibold tracking-wide text-ink-600 uppercase';

export const inputClass =
  'min-h-12 w-full rounded-lg border border-steam-200 bg-white px-3 text-lg text-ink-900 aria-invalid:border-copper-700 aria-invalid:border-2';

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
      <label htmlFor={fieldId} className={labelClass}>
        {label}
      </label>
      <div className="flex items-center gap-2">
        {prefix && <span className="text-lg text-ink-600">{prefix}</span>}
        <input
          id={fieldId}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${fieldId}-error` : undefined}
          className={inputClass}
          {...input}
        />
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

const SOURCES = { EU: 'Regulation (EU) No 1169/2011, Annex II', US: 'US major food allergens (FALCPA, FASTER Act)' } as const;

/**
 * What it contains, by group, and the allergens that follow on the café's list as the owner ticks.
 * A stand-in for an old tag ("tree nuts (unspecified)") shows only while it is ticked, asking for
 * the real ingredient.
 */
export function IngredientPicker({
  list,
  value,
  onChange,
  hint,
  error,
}: {
  list: AllergenList;
  value: readonly string[];
  onChange(next: string[]): void;
  hint?: string;
  error?: string;
}) {
  const allergens = allergensFrom(value, list);
  const vague = unspecifiedOf(value);
  return (
    <fieldset className="flex flex-col gap-3" data-testid="ingredient-picker">
      <legend className="mb-1 text-sm font-semibold tracking-wide text-ink-600 uppercase">Ingredients</legend>
      <p className="text-sm text-ink-600">{`${hint ? `${hint} ` : ''}Tick what it contains; the allergens follow for the café's list.`}</p>
      {INGREDIENT_GROUPS.map((group) => (
        <CheckGroup
          key={group}
          legend={group}
          choices={ingredientsIn(group)
            .filter((i) => !unspecifiedOf([i]).length || value.includes(i))
            .map((i) => ({ value: i as string, label: i }))}
          value={value}
          onChange={(next) => onChange(inOrder(next))}
        />
      ))}
      {vague.length > 0 && (
        <p role="note" className="text-base font-semibold">
          ⚠ {vague.join(', ')}: carried over from an old allergen tag. Tick the real ingredient and untick this.
        </p>
      )}
      <p className="rounded-lg border-2 border-ink-900 px-3 py-2 text-base" data-testid="derived-allergens">
        <strong>Allergens on the {list} list:</strong> {allergens.length ? allergens.join(', ') : 'none'}
        <span className="block text-sm text-ink-600">
          {SOURCES[list]}. {ALLERGEN_CAUTION}
        </span>
      </p>
      <FieldError message={error} />
    </fieldset>
  );
}
