// Bar: the wait target tickets are timed against and the milk each jug loses. Opening a shift
// sets the target for that shift; this is the café's standing target.
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { JUG_WASTE_MAX_ML, WAIT_TARGET_SECONDS, type SettingsView } from '../../domain/settings-schemas';
import { cn } from '../../lib/cn';
import { settingsCommands } from '../../lib/settings-api';
import { Field, SettingsSection, type SaveStatus } from './section';
import { showServerErrors } from './server-errors';
import { useSettingsCommand } from './use-settings-command';

const whole = (what: string) => z.number({ error: `Enter ${what}` }).int(`Whole ${what}`);
const barForm = z
  .object({
    minutes: whole('minutes').min(0, 'Not below 0'),
    seconds: whole('seconds').min(0, 'From 0 to 59').max(59, 'From 0 to 59'),
    jugWasteMl: whole('ml').min(0, 'Not below 0').max(JUG_WASTE_MAX_ML, `At most ${JUG_WASTE_MAX_ML} ml`),
  })
  .refine(({ minutes, seconds }) => minutes * 60 + seconds >= WAIT_TARGET_SECONDS.min && minutes * 60 + seconds <= WAIT_TARGET_SECONDS.max, {
    path: ['minutes'],
    message: `Between ${WAIT_TARGET_SECONDS.min / 60} and ${WAIT_TARGET_SECONDS.max / 60} minutes`,
  });
type BarForm = z.infer<typeof barForm>;

const formValues = (s: SettingsView): BarForm => ({
  minutes: Math.floor(s.waitTargetSeconds / 60),
  seconds: s.waitTargetSeconds % 60,
  jugWasteMl: s.jugWasteMl,
});

export function BarSection({ settings }: { settings: SettingsView }) {
  const form = useForm<BarForm>({ resolver: zodResolver(barForm), defaultValues: formValues(settings) });
  const [status, setStatus] = useState<SaveStatus>(null);
  const save = useSettingsCommand(settingsCommands.update, (p) => {
    form.reset(formValues(p.settings));
    setStatus({ ok: true, text: 'Saved — open Bars time tickets against it now' });
  });
  const errors = form.formState.errors;
  const number = { valueAsNumber: true } as const;
  return (
    <SettingsSection
      id="settings-bar"
      title="Bar"
      intro="The wait target is what the Bar's pour line fills toward and Pulse counts tickets over. A shift opened on Pulse sets its own."
      status={status}
      saving={save.isPending}
      onSubmit={form.handleSubmit((v) => {
        setStatus(null);
        save.mutate(
          { waitTargetSeconds: v.minutes * 60 + v.seconds, jugWasteMl: v.jugWasteMl },
          { onError: (e) => setStatus({ ok: false, text: showServerErrors(e, form.setError, { waitTargetSeconds: 'minutes', jugWasteMl: 'jugWasteMl' }) }) },
        );
      })}
    >
      <fieldset>
        <legend className="text-base font-semibold">Wait target (fired → ready)</legend>
        <div className="mt-1 flex items-start gap-3">
          <Field label="Minutes" error={errors.minutes?.message}>
            {(p) => <input {...p} {...form.register('minutes', number)} inputMode="numeric" className={cn(p.className, 'w-24')} />}
          </Field>
          <Field label="Seconds" error={errors.seconds?.message}>
            {(p) => <input {...p} {...form.register('seconds', number)} inputMode="numeric" className={cn(p.className, 'w-24')} />}
          </Field>
        </div>
        <p className="mt-1 text-sm text-ink-600">From 1 to 30 minutes.</p>
      </fieldset>
      <Field
        label="Milk lost per jug (ml)"
        help="Left in the pitcher or purged; the jug plan pours this much more than the drinks take."
        error={errors.jugWasteMl?.message}
      >
        {(p) => <input {...p} {...form.register('jugWasteMl', number)} inputMode="numeric" className={cn(p.className, 'w-28')} />}
      </Field>
    </SettingsSection>
  );
}
