// Add a person: name, sign-in name, e-mail and role; they get an invitation link by mail.
import { zodResolver } from '@hookform/resolvers/zod';
import { Controller, useForm } from 'react-hook-form';
import { ROLES } from '@/domain/roles';
import { LINK_HOURS, newPersonBody, type NewPersonBody } from '@/domain/team-schemas';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { Segmented } from '@/components/ui/segmented';
import { ApiError } from '@/lib/http';
import { useHydrated } from '@/lib/use-hydrated';
import type { TeamCommand, TeamResult } from './commands';

const field = 'mt-1 w-full rounded-lg border border-steam-200 bg-white px-3 py-2.5 text-lg';
const ROLE_HINTS: Record<(typeof ROLES)[number], string> = {
  cashier: 'Counter',
  barista: 'Bar',
  lead: 'Pulse, refunds',
  owner: 'everything',
};

type Input = { name: string; username: string; email: string; role: NewPersonBody['role'] };

export function AddPersonForm({ run, onDone }: { run(c: TeamCommand): Promise<TeamResult>; onDone(message: string): void }) {
  const hydrated = useHydrated();
  const form = useForm<Input, unknown, NewPersonBody>({
    resolver: zodResolver(newPersonBody),
    defaultValues: { name: '', username: '', email: '', role: 'barista' },
  });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (body) => {
    try {
      const result = await run({ kind: 'add', body });
      if (result.kind !== 'add') return;
      form.reset();
      onDone(
        result.mailed
          ? `${result.member.name} was added. The invitation went to ${body.email}; its link works once, for ${LINK_HOURS} hours.`
          : `${result.member.name} was added, but the mail server did not take the invitation. Send it again from the list.`,
      );
    } catch (err) {
      if (err instanceof ApiError && err.details?.length) {
        for (const d of err.details) if (d.path in body) form.setError(d.path as keyof Input, { message: d.message });
      }
      form.setError('root', { message: err instanceof ApiError ? err.message : 'Could not add the person' });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-labelledby="add-heading" className="rounded-xl border border-steam-200 bg-white p-5">
      <h2 id="add-heading" className="text-xl font-semibold">
        Add a person
      </h2>
      <p className="mt-1 text-base text-ink-600">They get a link by e-mail to set their own password.</p>
      <label className="mt-4 block text-base font-semibold" htmlFor="new-name">
        Name
      </label>
      <input id="new-name" autoComplete="off" aria-invalid={!!errors.name} className={field} {...form.register('name')} />
      <FieldError message={errors.name?.message} />
      <label className="mt-3 block text-base font-semibold" htmlFor="new-username">
        Sign-in name
      </label>
      <input id="new-username" autoComplete="off" autoCapitalize="none" aria-invalid={!!errors.username} className={field} {...form.register('username')} />
      <FieldError message={errors.username?.message} />
      <label className="mt-3 block text-base font-semibold" htmlFor="new-email">
        E-mail
      </label>
      <input id="new-email" type="email" autoComplete="off" aria-invalid={!!errors.email} className={field} {...form.register('email')} />
      <FieldError message={errors.email?.message} />
      <div className="mt-4">
        <Controller
          control={form.control}
          name="role"
          render={({ field: f }) => (
            <Segmented
              label="Role"
              value={f.value}
              onChange={f.onChange}
              options={ROLES.map((r) => ({ value: r, label: r[0].toUpperCase() + r.slice(1), hint: ROLE_HINTS[r] }))}
            />
          )}
        />
      </div>
      <FieldError message={errors.root?.message} />
      <Button type="submit" size="lg" className="mt-5 w-full" disabled={!hydrated || isSubmitting}>
        {isSubmitting ? 'Sending…' : 'Add and send invitation'}
      </Button>
    </form>
  );
}
