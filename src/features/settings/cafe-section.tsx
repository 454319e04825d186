// Café: its name, the time zone its day runs in (business dates, receipts, reports) and the
// locale its numbers and dates are written in.
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { cafeNameField, localeField, timeZoneField, type SettingsView } from '@/domain/settings-schemas';
import { send } from '@/lib/commands';
import { useHydrated } from '@/lib/use-hydrated';
import { Field, SettingsSection, type SaveStatus } from './section';
import { showServerErrors } from './server-errors';
import { useSettingsCommand } from './use-settings-command';

const cafeForm = z.object({ name: cafeNameField, timeZone: timeZoneField, locale: localeField });
type CafeForm = z.input<typeof cafeForm>;

// The browser's own list, after hydration: the server's Intl data may name other zones.
const zones = () => (typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('timeZone') : []);

export function CafeSection({ settings }: { settings: SettingsView }) {
  const form = useForm<CafeForm, unknown, z.output<typeof cafeForm>>({
    resolver: zodResolver(cafeForm),
    defaultValues: { name: settings.name, timeZone: settings.timeZone, locale: settings.locale },
  });
  const [status, setStatus] = useState<SaveStatus>(null);
  const save = useSettingsCommand(send.updateSettings, (page) => {
    form.reset({ name: page.settings.name, timeZone: page.settings.timeZone, locale: page.settings.locale });
    setStatus({ ok: true, text: 'Saved' });
  });
  const errors = form.formState.errors;
  const hydrated = useHydrated();
  return (
    <SettingsSection
      id="settings-cafe"
      title="Café"
      intro="The name on receipts and screens; the time zone the café's day runs in (order numbers restart at local midnight; reports use it)."
      status={status}
      saving={save.isPending}
      onSubmit={form.handleSubmit((v) => {
        setStatus(null);
        save.mutate(v, {
          onError: (e) => setStatus({ ok: false, text: showServerErrors(e, form.setError, { name: 'name', timeZone: 'timeZone', locale: 'locale' }) }),
        });
      })}
    >
      <Field label="Café name" error={errors.name?.message}>
        {(p) => <input {...p} {...form.register('name')} autoComplete="organization" />}
      </Field>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Time zone" help="An IANA name, e.g. America/New_York, Europe/Dublin" error={errors.timeZone?.message}>
          {(p) => <input {...p} {...form.register('timeZone')} list="settings-zones" spellCheck={false} />}
        </Field>
        <Field label="Locale" help="How numbers and dates are written, e.g. en-US, en-GB, de-DE" error={errors.locale?.message}>
          {(p) => <input {...p} {...form.register('locale')} spellCheck={false} />}
        </Field>
      </div>
      <datalist id="settings-zones">
        {(hydrated ? zones() : []).map((z) => (
          <option key={z} value={z} />
        ))}
      </datalist>
    </SettingsSection>
  );
}
