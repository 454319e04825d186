// Bar: the wait target tickets are timed against, and the rules the jug plan keeps: the milk each
// jug loses, the most drinks in one jug, and how much milk grows when steamed for each texture.
// Opening a shift sets the target for that shift; this is the café's standing target.
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { EXPANSION_MAX_PCT, JUG_MAX_DRINKS, JUG_WASTE_MAX_ML, WAIT_TARGET_SECONDS, type SettingsView } from '@/domain/settings-schemas';
import { cn } from '@/lib/cn';
import { send } from '@/lib/commands';
import { Field, SettingsSection, type SaveStatus } from './section';
import { showServerErrors } from './server-errors';
import { useSettingsCommand } from './use-settings-command';

const whole = (what: string) => z.number({ error: `Enter ${what}` }).int(`Whole ${what}`);
const percent = whole('percent').min(0, 'Not below 0').max(EXPANSION_MAX_PCT, `At most ${EXPANSION_MAX_PCT} %`);
const JUG_FIELDS = ['jugWasteMl', 'jugMaxDrinks', 'expansionFlatPct', 'expansionSilkyPct', 'expansionFoamyPct'] as const;

/** Milk growth when steamed: our defaults and the usual range (common practice, from memory). */
const GROWTH = [
  { field: 'expansionFlatPct', label: 'Flat (%)', usual: '10–20 %' },
  { field: 'expansionSilkyPct', label: 'Silky (%)', usual: '20–30 %' },
  { field: 'expansionFoamyPct', label: 'Foamy (%)', usual: '50–100 %' },
] as const;
const barForm = z
  .object({
    minutes: whole('minutes').min(0, 'Not below 0'),
    seconds: whole('seconds').min(0, 'From 0 to 59').max(59, 'From 0 to 59'),
    jugWasteMl: whole('ml').min(0, 'Not below 0').max(JUG_WASTE_MAX_ML, `At most ${JUG_WASTE_MAX_ML} ml`),
    jugMaxDrinks: whole('drinks').min(JUG_MAX_DRINKS.min, `At least ${JUG_MAX_DRINKS.min}`).max(JUG_MAX_DRINKS.max, `At most ${JUG_MAX_DRINKS.max}`),
    expansionFlatPct: percent,
    expansionSilkyPct: percent,
    expansionFoamyPct: percent,
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
  jugMaxDrinks: s.jugMaxDrinks,
  expansionFlatPct: s.expansionFlatPct,
  expansionSilkyPct: s.expansionSilkyPct,
  expansionFoamyPct: s.expansionFoamyPct,
});

export function BarSection({ settings }: { settings: SettingsView }) {
  const form = useForm<BarForm>({ resolver: zodResolver(barForm), defaultValues: formValues(settings) });
  const [status, setStatus] = useState<SaveStatus>(null);
  const save = useSettingsCommand(send.updateSettings, (p) => {
    form.reset(formValues(p.settings));
    setStatus({ ok: true, text: 'Saved — open Bars time tickets against it now' });
  });
  const errors = form.formState.errors;
  const number = { valueAsNumber: true } as const;
  return (
    <SettingsSection
      id="settings-bar"
      title="Bar"
      intro="The wait target is what the Bar's pour line fills toward and Pulse counts tickets over. A shift opened on Pulse sets its own. The rest are the jug plan's rules; a jug already started keeps the pour it was started with."
      status={status}
      saving={save.isPending}
      onSubmit={form.handleSubmit((v) => {
        setStatus(null);
        const { minutes, seconds, ...jug } = v;
        save.mutate(
          { waitTargetSeconds: minutes * 60 + seconds, ...jug },
          {
            onError: (e) =>
              setStatus({
                ok: false,
                text: showServerErrors(e, form.setError, { waitTargetSeconds: 'minutes', ...Object.fromEntries(JUG_FIELDS.map((f) => [f, f])) }),
              }),
          },
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
      <Field
        label="Most drinks in one jug"
        help="Two to four cups from one jug is usual: in a bigger one the foam separates before the last cup is poured."
        error={errors.jugMaxDrinks?.message}
      >
        {(p) => <input {...p} {...form.register('jugMaxDrinks', number)} inputMode="numeric" className={cn(p.className, 'w-28')} />}
      </Field>
      <fieldset>
        <legend className="text-base font-semibold">How much milk grows when steamed</legend>
        <p className="text-sm text-ink-600">
          The jug plan leaves this much room above the cold milk, for the texture the jug is steamed for, so it stays in the pitcher.
        </p>
        <div className="mt-1 flex flex-wrap items-start gap-3">
          {GROWTH.map(({ field, label, usual }) => (
            <Field key={field} label={label} help={`usually ${usual}`} error={errors[field]?.message}>
              {(p) => <input {...p} {...form.register(field, number)} inputMode="numeric" className={cn(p.className, 'w-24')} />}
            </Field>
          ))}
        </div>
      </fieldset>
    </SettingsSection>
  );
}
