// The owner sets, changes or removes someone's switch PIN.
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { PIN_MAX_DIGITS, PIN_MIN_DIGITS, pinSchema, type TeamMember } from '@/domain/team-schemas';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { ApiError } from '@/lib/http';
import type { TeamCommand, TeamResult } from './commands';

const schema = z.object({ pin: pinSchema });

export function PinForm({
  member,
  run,
  onDone,
  onCancel,
}: {
  member: TeamMember;
  run(c: TeamCommand): Promise<TeamResult>;
  onDone(message: string): void;
  onCancel(): void;
}) {
  const form = useForm<{ pin: string }>({ resolver: zodResolver(schema), defaultValues: { pin: '' } });
  const { errors, isSubmitting } = form.formState;
  const send = async (pin: string | null) => {
    try {
      await run({ kind: 'pin', id: member.id, pin });
      onDone(pin === null ? `${member.name}'s PIN was removed.` : `${member.name}'s PIN is set. Tell them in person, not by mail.`);
    } catch (err) {
      form.setError('root', { message: err instanceof ApiError ? err.message : 'Could not save the PIN' });
    }
  };
  const id = `pin-${member.id}`;
  return (
    <form onSubmit={form.handleSubmit(({ pin }) => send(pin))} noValidate className="flex flex-wrap items-start gap-3">
      <div>
        <label htmlFor={id} className="block text-base font-semibold">
          New PIN for {member.name} ({PIN_MIN_DIGITS}–{PIN_MAX_DIGITS} digits)
        </label>
        <input
          id={id}
          type="password"
          inputMode="numeric"
          autoComplete="off"
          maxLength={PIN_MAX_DIGITS}
          aria-invalid={!!errors.pin}
          className="mt-1 w-48 rounded-lg border border-steam-200 bg-white px-3 py-2 font-display text-2xl tracking-[0.3em]"
          {...form.register('pin')}
        />
        <FieldError message={errors.pin?.message ?? errors.root?.message} />
      </div>
      <div className="mt-7 flex gap-2">
        <Button type="submit" disabled={isSubmitting}>
          Save PIN
        </Button>
        {member.hasPin && (
          <Button tone="quiet" disabled={isSubmitting} onClick={() => send(null)}>
            Remove PIN
          </Button>
        )}
        <Button tone="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
