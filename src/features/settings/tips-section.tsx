// Tips: off, or on with up to three suggested percentages and, if allowed, an amount the customer
// names. The Counter shows them before payment; a tip is never taxed and stays out of net revenue.
import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import type { SettingsView } from '@/domain/settings-schemas';
import { TIP_PERCENT, TIP_SUGGESTIONS_MAX } from '@/domain/tips';
import { cn } from '@/lib/cn';
import { send } from '@/lib/commands';
import { Field, SettingsSection, type SaveStatus } from './section';
import { showServerErrors } from './server-errors';
import { useSettingsCommand } from './use-settings-command';

const SLOTS = Array.from({ length: TIP_SUGGESTIONS_MAX }, (_, i) => i);
const range = `a whole percent from ${TIP_PERCENT.min} to ${TIP_PERCENT.max}, or blank`;
// each suggestion as typed: blank (none) or a whole percent in range
const percentText = z.string().refine((v) => {
  if (v.trim() === '') return true;
  const n = Number(v);
  return Number.isInteger(n) && n >= TIP_PERCENT.min && n <= TIP_PERCENT.max;
}, `Suggested tip: ${range}`);
const tipsForm = z
  .object({ tipsOn: z.boolean(), percents: z.array(percentText), tipCustom: z.boolean() })
  .refine((f) => !f.tipsOn || f.tipCustom || f.percents.some((p) => p.trim() !== ''), {
    path: ['percents', 0],
    message: 'Suggest at least one tip, or allow a custom amount',
  })
  .refine((f) => new Set(f.percents.filter((p) => p.trim() !== '').map(Number)).size === f.percents.filter((p) => p.trim() !== '').length, {
    path: ['percents', 1],
    message: 'Each suggested tip once',
  });
type TipsForm = z.infer<typeof tipsForm>;

const formValues = (s: SettingsView): TipsForm => ({
  tipsOn: s.tipsOn,
  percents: SLOTS.map((i) => (s.tipPercents[i] === undefined ? '' : String(s.tipPercents[i]))),
  tipCustom: s.tipCustom,
});

export function TipsSection({ settings }: { settings: SettingsView }) {
  const form = useForm<TipsForm>({ resolver: zodResolver(tipsForm), defaultValues: formValues(settings) });
  const [status, setStatus] = useState<SaveStatus>(null);
  const save = useSettingsCommand(send.updateSettings, (p) => {
    form.reset(formValues(p.settings));
    setStatus({ ok: true, text: 'Saved' });
  });
  const errors = form.formState.errors;
  const on = form.watch('tipsOn');
  const help = useId();
  return (
    <SettingsSection
      id="settings-tips"
      title="Tips"
      status={status}
      saving={save.isPending}
      onSubmit={form.handleSubmit((v) => {
        setStatus(null);
        const tipPercents = v.percents.filter((p) => p.trim() !== '').map(Number);
        save.mutate(
          { tipsOn: v.tipsOn, tipPercents, tipCustom: v.tipCustom },
          { onError: (e) => setStatus({ ok: false, text: showServerErrors(e, form.setError, { tipPercents: 'percents.0', tipsOn: 'tipsOn' }) }) },
        );
      })}
    >
      <div>
        <label className="flex min-h-11 items-center gap-3 text-lg font-semibold">
          <input type="checkbox" className="size-6 accent-copper-700" aria-describedby={help} {...form.register('tipsOn')} />
          Take tips at the Counter
        </label>
        <p id={help} className="text-sm text-ink-600">
          Before payment the cashier offers “No tip” and the choices below. A tip is on top of the total: never taxed, and shown apart from net revenue in the
          reports. A percentage is of the total with tax, after any discount.
        </p>
      </div>
      <fieldset disabled={!on} className={cn('flex flex-col gap-3', !on && 'opacity-60')}>
        <div className="flex flex-wrap gap-3">
          {SLOTS.map((i) => (
            <Field key={i} label={`Suggestion ${i + 1} (%)`} error={errors.percents?.[i]?.message}>
              {(p) => <input {...p} {...form.register(`percents.${i}`)} inputMode="numeric" className={cn(p.className, 'w-24')} />}
            </Field>
          ))}
        </div>
        <p className="text-sm text-ink-600">Up to three, each {range}; 10, 15 and 20 are usual.</p>
        <label className="flex min-h-11 items-center gap-3 text-lg font-semibold">
          <input type="checkbox" className="size-6 accent-copper-700" {...form.register('tipCustom')} />
          Let the customer name another amount
        </label>
      </fieldset>
    </SettingsSection>
  );
}
