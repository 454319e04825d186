// A PIN pad for a touch terminal: big digit buttons over a masked field that a keyboard can type
// into too (digits, Backspace, Enter).
import { useEffect, useRef } from 'react';
import { PIN_MAX_DIGITS } from '@/domain/team-schemas';
import { cn } from '@/lib/cn';

interface Props {
  value: string;
  onChange(value: string): void;
  onSubmit(): void;
  disabled?: boolean;
  /** Labels the field, e.g. "PIN for Jonah Reyes". */
  label: string;
  describedBy?: string;
}

const KEYS = ['1', '2', '3', '4', '5', '6', '7', '8', '9', 'clear', '0', 'back'] as const;

export function PinPad({ value, onChange, onSubmit, disabled, label, describedBy }: Props) {
  const field = useRef<HTMLInputElement>(null);
  useEffect(() => field.current?.focus(), []);
  const press = (key: (typeof KEYS)[number]) => {
    if (key === 'clear') onChange('');
    else if (key === 'back') onChange(value.slice(0, -1));
    else if (value.length < PIN_MAX_DIGITS) onChange(value + key);
    field.current?.focus();
  };
  return (
    <div className="flex flex-col items-center gap-4">
      <label htmlFor="pin-field" className="sr-only">
        {label}
      </label>
      <input
        ref={field}
        id="pin-field"
        type="password"
        inputMode="numeric"
        autoComplete="off"
        maxLength={PIN_MAX_DIGITS}
        value={value}
        disabled={disabled}
        aria-describedby={describedBy}
        onChange={(e) => onChange(e.target.value.replace(/\D/g, '').slice(0, PIN_MAX_DIGITS))}
        onKeyDown={(e) => {
          if (e.key === 'Enter') {
            e.preventDefault();
            onSubmit();
          }
        }}
        className="h-16 w-64 rounded-xl border-2 border-steam-200 bg-white text-center font-display text-4xl tracking-[0.5em] text-ink-900"
      />
      <div className="grid grid-cols-3 gap-3" role="group" aria-label="PIN pad">
        {KEYS.map((key) => (
          <button
            key={key}
            type="button"
            disabled={disabled}
            onClick={() => press(key)}
            aria-label={key === 'clear' ? 'Clear' : key === 'back' ? 'Delete last digit' : key}
            className={cn(
              'grid size-20 place-items-center rounded-xl border border-steam-200 font-semibold select-none disabled:opacity-50',
              key.length === 1 ? 'bg-steam-100 font-display text-4xl hover:bg-steam-200' : 'bg-white text-lg text-ink-600 hover:bg-steam-100',
            )}
          >
            {key === 'clear' ? 'Clear' : key === 'back' ? '⌫' : key}
          </button>
        ))}
      </div>
    </div>
  );
}
