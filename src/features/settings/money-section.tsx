// Money and tax: the currency, whether prices include tax, the rate, and the extra shot price.
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { z } from 'zod';
import { formatCents, parseAmountToCents, taxCents } from '@/domain/money';
import { currencyField, currencyProblem, EXTRA_SHOT_MAX_CENTS, percentToMilli, SETTINGS_FIELDS, type SettingsView } from '@/domain/settings-schemas';
import { Segmented } from '@/components/ui/segmented';
import { cn } from '@/lib/cn';
import { send } from '@/lib/commands';
import { Field, SettingsSection, type SaveStatus } from './section';
import { showServerErrors } from './server-errors';
import { useSettingsCommand } from './use-settings-command';

// The rate and the price stay as typed; the API takes the percent text and the price in cents.
const moneyForm = z.object({
  currency: currencyField,
  taxMode: SETTINGS_FIELDS.taxMode,
  taxRatePercent: z.string().refine((v) => percentToMilli(v) !== null, 'A percent from 0 to 100 with up to 3 decimals, like 8.25'),
  extraShot: z.string().refine(
    (v) => {
      const cents = parseAmountToCents(v);
      return cents !== null && cents <= EXTRA_SHOT_MAX_CENTS;
    },
    `An amount from 0 to ${EXTRA_SHOT_MAX_CENTS / 100}, like 1.00`,
  ),
});
type MoneyForm = z.input<typeof moneyForm>;

const SERVER_FIELDS = { currency: 'currency', taxMode: 'taxMode', taxRatePercent: 'taxRatePercent', extraShotCents: 'extraShot' } as const;
const EXAMPLE_CENTS = 540;

const formValues = (s: SettingsView): MoneyForm => ({
  currency: s.currency,
  taxMode: s.taxMode,
  taxRatePercent: s.taxRatePercent,
  extraShot: (s.extraShotCents / 100).toFixed(2),
});

export function MoneySection({ settings }: { settings: SettingsView }) {
  const form = useForm<MoneyForm, unknown, z.output<typeof moneyForm>>({ resolver: zodResolver(moneyForm), defaultValues: formValues(settings) });
  const [status, setStatus] = useState<SaveStatus>(null);
  const save = useSettingsCommand(send.updateSettings, (page) => {
    form.reset(formValues(page.settings));
    setStatus({ ok: true, text: 'Saved — the Counter prices with it from the next order' });
  });
  const errors = form.formState.errors;
  const [currency, mode, rate] = form.watch(['currency', 'taxMode', 'taxRatePercent']);
  const milli = percentToMilli(rate ?? '');
  const showCurrency = currencyProblem(currency ?? '') ? settings.currency : currency;
  const example =
    milli === null
      ? null
      : (() => {
          const tax = taxCents(EXAMPLE_CENTS, milli, mode);
          const money = (c: number) => formatCents(c, showCurrency);
          return mode === 'exclusive'
            ? `A ${money(EXAMPLE_CENTS)} drink: tax ${money(tax)}, the customer pays ${money(EXAMPLE_CENTS + tax)}.`
            : `A ${money(EXAMPLE_CENTS)} drink: the customer pays ${money(EXAMPLE_CENTS)}, of which ${money(tax)} is tax.`;
        })();

  return (
    <SettingsSection
      id="settings-money"
      title="Money and tax"
      intro="Prices are kept in cents. Tax is rounded half up to the cent on the whole order."
      status={status}
      saving={save.isPending}
      onSubmit={form.handleSubmit((v) => {
        setStatus(null);
        const body = { currency: v.currency, taxMode: v.taxMode, taxRatePercent: v.taxRatePercent, extraShotCents: parseAmountToCents(v.extraShot)! };
        save.mutate(body, { onError: (e) => setStatus({ ok: false, text: showServerErrors(e, form.setError, SERVER_FIELDS) }) });
      })}
    >
      <div className="grid gap-4 sm:grid-cols-3">
        <Field label="Currency" help="ISO 4217 code, e.g. USD, EUR, GBP" error={errors.currency?.message}>
          {(p) => (
            <input
              {...p}
              {...form.register('currency', { setValueAs: (v: string) => v.toUpperCase() })}
              maxLength={3}
              spellCheck={false}
              className={cn(p.className, 'uppercase')}
            />
          )}
        </Field>
        <Field label="Tax rate (%)" help="Up to 3 decimals: 8.25 or 8.875" error={errors.taxRatePercent?.message}>
          {(p) => <input {...p} {...form.register('taxRatePercent')} inputMode="decimal" />}
        </Field>
        <Field label="Extra shot price" help="Added for each shot over the recipe" error={errors.extraShot?.message}>
          {(p) => <input {...p} {...form.register('extraShot')} inputMode="decimal" />}
        </Field>
      </div>
      <Controller
        control={form.control}
        name="taxMode"
        render={({ field }) => (
          <Segmented
            label="Menu prices"
            value={field.value}
            onChange={field.onChange}
            options={[
              { value: 'exclusive', label: 'Tax added on top', hint: 'as in most of the US' },
              { value: 'inclusive', label: 'Tax included', hint: 'as with VAT' },
            ]}
          />
        )}
      />
      {example && (
        <p className="text-base" data-testid="tax-example">
          {example}
        </p>
      )}
    </SettingsSection>
  );
}
