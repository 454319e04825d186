// A settings section: a card with its title, what it changes, its fields and one save button,
// and the answer of its last save in words (never colour alone).
import { useId, type FormEventHandler, type ReactNode } from 'react';
import { Button } from '@/components/ui/button';

export type SaveStatus = { ok: true; text: string } | { ok: false; text: string } | null;

interface Props {
  id: string;
  title: string;
  intro?: ReactNode;
  status: SaveStatus;
  saving: boolean;
  saveLabel?: string;
  onSubmit: FormEventHandler<HTMLFormElement>;
  children: ReactNode;
}

export function SettingsSection({ id, title, intro, status, saving, saveLabel = 'Save', onSubmit, children }: Props) {
  return (
    <form aria-labelledby={id} noValidate onSubmit={onSubmit} className="flex flex-col gap-4 rounded-2xl border border-steam-200 bg-white p-5">
      <div>
        <h2 id={id} className="text-2xl font-semibold">
          {title}
        </h2>
        {intro && <p className="mt-1 text-base text-ink-600">{intro}</p>}
      </div>
      {children}
      <div className="flex flex-wrap items-center gap-4 border-t border-steam-200 pt-4">
        <Button type="submit" size="lg" disabled={saving}>
          {saving ? 'Saving…' : saveLabel}
        </Button>
        <SaveStatusText status={status} />
      </div>
    </form>
  );
}

export function SaveStatusText({ status }: { status: SaveStatus }) {
  if (!status) return null;
  return status.ok ? (
    <p role="status" className="text-lg font-semibold text-ink-900">
      <span aria-hidden>✓ </span>
      {status.text}
    </p>
  ) : (
    <p role="alert" className="text-lg font-semibold text-copper-700">
      <span aria-hidden>⚠ </span>
      {status.text}
    </p>
  );
}

const inputClass = 'mt-1 block w-full rounded-lg border border-steam-200 bg-white px-3 py-2 text-lg aria-[invalid=true]:border-copper-700';

interface InputProps {
  id: string;
  className: string;
  'aria-invalid': boolean;
  'aria-describedby'?: string;
}

/** A labelled input with its help and its error beside it (described by both, named by the label). */
export function Field({ label, help, error, children }: { label: string; help?: ReactNode; error?: string; children: (props: InputProps) => ReactNode }) {
  const id = useId();
  const described = [help ? `${id}-help` : '', error ? `${id}-error` : ''].filter(Boolean).join(' ') || undefined;
  return (
    <div>
      <label htmlFor={id} className="text-base font-semibold">
        {label}
      </label>
      {children({ id, className: inputClass, 'aria-invalid': !!error, 'aria-describedby': described })}
      {help && (
        <p id={`${id}-help`} className="mt-1 text-sm text-ink-600">
          {help}
        </p>
      )}
      {error && (
        <p id={`${id}-error`} role="alert" className="mt-1 text-sm font-semibold text-copper-700">
          {error}
        </p>
      )}
    </div>
  );
}
