// Receipts and Pickup: the line at the foot of every receipt, whether a customer who left an
// address is mailed when the order is ready, and how long a ready name stays on the Pickup board
// when nobody marks it collected.
import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useState } from 'react';
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
  readyMail: z.boolean(),
});
type ReceiptsForm = z.infer<typeof receiptsForm>;

const formValues = (s: SettingsView): ReceiptsForm => ({
  receiptFooter: s.receiptFooter ?? '',
  pickupMinutes: Math.round(s.pickupTimeoutSeconds / 60),
  readyMail: s.readyMail,
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
  const readyHelp = useId();
  return (
    <SettingsSection
      id="settings-receipts"
      title="Receipts and Pickup"
      status={status}
      saving={save.isPending}
      onSubmit={form.handleSubmit((v) => {
        setStatus(null);
        save.mutate(
          { receiptFooter: v.receiptFooter, pickupTimeoutSeconds: v.pickupMinutes * 60, readyMail: v.readyMail },
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
      <div>
        <label className="flex min-h-11 items-center gap-3 text-lg font-semibold">
          <input type="checkbox" className="size-6 accent-copper-700" aria-describedby={readyHelp} {...form.register('readyMail')} />
          Mail the customer when the order is ready
        </label>
        <p id={readyHelp} className="text-sm text-ink-600">
          Only to a customer who left an address for the receipt, once per order. The Counter tells them the address is used for this too.
        </p>
      </div>
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
