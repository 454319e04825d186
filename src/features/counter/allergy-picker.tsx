// Allergies the customer names, chosen from the café's published list, plus their own words.
import { allergensOf, type AllergenList } from '@/domain/allergens';
import { cn } from '@/lib/cn';

interface Props {
  list: AllergenList;
  value: string[];
  note: string;
  onChange(allergens: string[]): void;
  onNote(note: string): void;
}

export function AllergyPicker({ list, value, note, onChange, onNote }: Props) {
  const toggle = (a: string) => onChange(value.includes(a) ? value.filter((x) => x !== a) : [...value, a]);
  return (
    <fieldset className="rounded-lg border-2 border-alert-deep/40 bg-white p-3">
      <legend className="px-1 text-sm font-semibold tracking-widest text-ink-600 uppercase">Allergy ({list === 'EU' ? 'EU 14' : 'US 9'} list)</legend>
      <div className="flex flex-wrap gap-1.5">
        {allergensOf(list).map((a) => {
          const on = value.includes(a);
          return (
            <button
              key={a}
              type="button"
              aria-pressed={on}
              onClick={() => toggle(a)}
              className={cn(
                'min-h-10 rounded-md border-2 px-2.5 text-base font-semibold',
                on ? 'border-ink-900 bg-alert-ink text-ink-900' : 'border-steam-200 bg-steam-50 text-ink-900',
              )}
            >
              {on && <span aria-hidden>⚠ </span>}
              {a}
            </button>
          );
        })}
      </div>
      <input
        aria-label="Allergy in the customer's words"
        placeholder="In their words, e.g. “severe — no cross-contact”"
        maxLength={200}
        className="mt-2 w-full rounded-md border border-steam-200 px-2 py-2 text-base"
        value={note}
        onChange={(e) => onNote(e.target.value)}
      />
      <p className="mt-1 text-sm text-ink-600">Tell the bar out loud too. Jugline flags the drink; it can't promise a kitchen free of traces.</p>
    </fieldset>
  );
}
