// Receipts and Pickup: the line at the foot of every receipt, and how long a ready name stays on
// the Pickup board when nobody marks it collected.
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { PICKUP_TIMEOUT_SECONDS, RECEIPT_FOOTER_MAX, type SettingsView } from '@/domain/settings-schemas';
import { cn } from '@/lib/cn';
import { send } from '@/lib/commands';
import { Field, SettingsSection, type SaveStatus } from './section';
import { showServerErrors } from './server-errors';
import { useSettingsCommand } from './use-settings-command';

const [MIN_MIN, MAX_MIN] = [PICKUP_TIMEOUT_SECONDS.min / 60, PICKUP_TIMEOUT_SECONDS.max / 60];
const receiptsForm = z.object({
  receiptFooter: z.string().max(RECEIPT_FOOTER_MAX, `At most ${RECEIPT_FOOTER_MAX} characters`),
  pickupMinutes: z
    .number({ error: 'Enter minutes' })
    .int('Whole minutes')
    .min(MIN_MIN, `From ${MIN_MIN} to ${MAX_MIN} minutes`)
    .max(MAX_MIN, `From ${MIN_MIN} to ${MAX_MIN} minutes`),
});
type ReceiptsForm = z.infer<typeof receiptsForm>;

const formValues = (s: SettingsView): ReceiptsForm => ({
  receiptFooter: s.receiptFooter ?? '',
  pickupMinutes: Math.round(s.pickupTimeoutSeconds / 60),
});

export function ReceiptsSection({ settings }: { settings: SettingsView }) {
  const form = useForm<ReceiptsForm>({ resolver: zodResolver(receiptsForm), defaultValues: formValues(settings) });
  const [status, setStatus] = useState<SaveStatus>(null);
  const save = useSettingsCommand(send.updateSettings, (p) => {
    form.reset(formValues(p.settings));
    setStatus({ ok: true, text: 'Saved' });
  });
  const errors = form.formState.errors;
  const footer = form.watch('receiptFooter') ?? '';
  return (
    <SettingsSection
      id="settings-receipts"
      title="Receipts and Pickup"
      status={status}
      saving={save.isPending}
      onSubmit={form.handleSubmit((v) => {
        setStatus(null);
        save.mutate(
          { receiptFooter: v.receiptFooter, pickupTimeoutSeconds: v.pickupMinutes * 60 },
          {
            onError: (e) =>
              setStatus({ ok: false, text: showServerErrors(e, form.setError, { receiptFooter: 'receiptFooter', pickupTimeoutSeconds: 'pickupMinutes' }) }),
          },
        );
      })}
    >
      <Field
        label="Receipt footer"
        help={`${footer.length} of ${RECEIPT_FOOTER_MAX} characters · printed at the foot of every receipt; leave empty for none`}
        error={errors.receiptFooter?.message}
      >
        {(p) => <textarea {...p} {...form.register('receiptFooter')} rows={2} maxLength={RECEIPT_FOOTER_MAX + 20} />}
      </Field>
      <Field
        label="Pickup board: a ready name stays (minutes)"
        help="Until the Counter marks the order collected, or this long after it is ready."
        error={errors.pickupMinutes?.message}
      >
        {(p) => <input {...p} {...form.register('pickupMinutes', { valueAsNumber: true })} inputMode="numeric" className={cn(p.className, 'w-28')} />}
      </Field>
    </SettingsSection>
  );
}
