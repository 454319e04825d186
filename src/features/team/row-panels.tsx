// What opens under a row of the Team table: the e-mail address, and the deactivation check.
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import type { TeamMember } from '@/domain/team-schemas';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { ApiError } from '@/lib/http';
import type { TeamCommand, TeamResult } from './commands';

interface PanelProps {
  member: TeamMember;
  run(c: TeamCommand): Promise<TeamResult>;
  onDone(message: string): void;
  onCancel(): void;
}

const emailForm = z.object({ email: z.union([z.literal(''), z.email('Not an e-mail address').max(254)]) });

export function EmailForm({ member, run, onDone, onCancel }: PanelProps) {
  const form = useForm<{ email: string }>({ resolver: zodResolver(emailForm), defaultValues: { email: member.email ?? '' } });
  const { errors, isSubmitting } = form.formState;
  const id = `email-${member.id}`;
  const onSubmit = form.handleSubmit(async ({ email }) => {
    try {
      await run({ kind: 'patch', id: member.id, body: { email: email || null } });
      onDone(email ? `${member.name}'s e-mail is now ${email}.` : `${member.name} has no e-mail address now.`);
    } catch (err) {
      form.setError('root', { message: err instanceof ApiError ? err.message : 'Could not save' });
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-wrap items-start gap-3">
      <div>
        <label htmlFor={id} className="block text-base font-semibold">
          E-mail of {member.name} (for invitation and reset links)
        </label>
        <input
          id={id}
          type="email"
          aria-invalid={!!errors.email}
          className="mt-1 w-80 rounded-lg border border-steam-200 bg-white px-3 py-2 text-lg"
          {...form.register('email')}
        />
        <FieldError message={errors.email?.message ?? errors.root?.message} />
      </div>
      <div className="mt-7 flex gap-2">
        <Button type="submit" disabled={isSubmitting}>
          Save e-mail
        </Button>
        <Button tone="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

export function DeactivateConfirm({ member, run, onDone, onCancel, isYou }: PanelProps & { isYou: boolean }) {
  const deactivate = async () => {
    try {
      await run({ kind: 'patch', id: member.id, body: { active: false } });
      onDone(`${member.name} is inactive: signed out on every screen, and can't sign in until reactivated.`);
    } catch (err) {
      onDone(err instanceof ApiError ? err.message : 'Could not deactivate');
    }
  };
  return (
    <div className="flex flex-wrap items-center gap-3">
      <p className="text-lg">
        Deactivate <strong>{member.name}</strong>? {isYou ? 'You will be signed out at once. ' : ''}They are signed out on every screen and can't sign in or
        switch in by PIN. Their past orders and bumps keep their name.
      </p>
      <div className="flex gap-2">
        <Button onClick={deactivate}>Yes, deactivate</Button>
        <Button tone="quiet" onClick={onCancel}>
          Keep active
        </Button>
      </div>
    </div>
  );
}
