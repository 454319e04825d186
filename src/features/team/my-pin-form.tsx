// A signed-in person sets their own switch PIN; their password shows it is them and not whoever
// happens to be at the terminal.
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { PIN_MAX_DIGITS, PIN_MIN_DIGITS, pinSchema } from '@/domain/team-schemas';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { send } from '@/lib/commands';
import { ApiError } from '@/lib/http';

const schema = z
  .object({ password: z.string().min(1, 'Enter your password').max(200), pin: pinSchema, again: z.string() })
  .refine((v) => v.pin === v.again, { path: ['again'], message: 'The two PINs differ' });
type Values = z.infer<typeof schema>;

const field = 'mt-1 w-full rounded-lg border border-steam-200 bg-white px-3 py-2.5 text-lg';

export function MyPinForm({ onDone, onCancel }: { onDone(message: string): void; onCancel(): void }) {
  const form = useForm<Values>({ resolver: zodResolver(schema), defaultValues: { password: '', pin: '', again: '' } });
  const { errors, isSubmitting } = form.formState;
  const onSubmit = form.handleSubmit(async ({ password, pin }) => {
    try {
      await send.setOwnPin({ password, pin });
      onDone('Your PIN is saved. Use it with "Switch person" on any terminal of this café.');
    } catch (err) {
      const detail = err instanceof ApiError ? err.details?.find((d) => d.path === 'password' || d.path === 'pin') : undefined;
      if (detail) form.setError(detail.path as 'password' | 'pin', { message: detail.message });
      else form.setError('root', { message: err instanceof ApiError ? err.message : 'Could not save the PIN' });
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="mt-4">
      <label htmlFor="my-password" className="block text-base font-semibold">
        Your password
      </label>
      <input
        id="my-password"
        type="password"
        autoComplete="current-password"
        aria-invalid={!!errors.password}
        className={field}
        {...form.register('password')}
      />
      <FieldError message={errors.password?.message} />
      <label htmlFor="my-pin" className="mt-3 block text-base font-semibold">
        New PIN ({PIN_MIN_DIGITS}–{PIN_MAX_DIGITS} digits)
      </label>
      <input
        id="my-pin"
        type="password"
        inputMode="numeric"
        autoComplete="off"
        maxLength={PIN_MAX_DIGITS}
        aria-invalid={!!errors.pin}
        className={field}
        {...form.register('pin')}
      />
      <FieldError message={errors.pin?.message} />
      <label htmlFor="my-pin-again" className="mt-3 block text-base font-semibold">
        The same PIN again
      </label>
      <input
        id="my-pin-again"
        type="password"
        inputMode="numeric"
        autoComplete="off"
        maxLength={PIN_MAX_DIGITS}
        aria-invalid={!!errors.again}
        className={field}
        {...form.register('again')}
      />
      <FieldError message={errors.again?.message ?? errors.root?.message} />
      <div className="mt-5 flex justify-between gap-3">
        <Button tone="quiet" onClick={onCancel}>
          ← Back
        </Button>
        <Button type="submit" disabled={isSubmitting}>
          Save my PIN
        </Button>
      </div>
    </form>
  );
}
