// Units: what cup sizes and temperatures read in. Display only — sizes, recipes and pitchers
// stay in millilitres — so the preview shows every cup size on the menu in the chosen unit.
import { ScrollBox } from '@/components/ui/scroll-box';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { z } from 'zod';
import { hotMilkNote } from '@/domain/cautions';
import { SETTINGS_FIELDS, type SettingsPage } from '@/domain/settings-schemas';
import { cupSizeLabel, exactUsFlOz, TEMPERATURE_UNIT_LABEL, TEMPERATURE_UNITS, VOLUME_UNIT_LABEL, VOLUME_UNITS } from '@/domain/units';
import { Segmented } from '@/components/ui/segmented';
import { send } from '@/lib/commands';
import { SettingsSection, type SaveStatus } from './section';
import { showServerErrors } from './server-errors';
import { useSettingsCommand } from './use-settings-command';

const unitsForm = z.object({ volumeUnit: SETTINGS_FIELDS.volumeUnit, temperatureUnit: SETTINGS_FIELDS.temperatureUnit });
type UnitsForm = z.infer<typeof unitsForm>;

export function UnitsSection({ page }: { page: SettingsPage }) {
  const { settings, cupSizes } = page;
  const form = useForm<UnitsForm>({
    resolver: zodResolver(unitsForm),
    defaultValues: { volumeUnit: settings.volumeUnit, temperatureUnit: settings.temperatureUnit },
  });
  const [status, setStatus] = useState<SaveStatus>(null);
  const save = useSettingsCommand(send.updateSettings, (p) => {
    form.reset({ volumeUnit: p.settings.volumeUnit, temperatureUnit: p.settings.temperatureUnit });
    setStatus({ ok: true, text: 'Saved — open Counters and Bars show it now' });
  });
  const [volume, temperature] = form.watch(['volumeUnit', 'temperatureUnit']);
  return (
    <SettingsSection
      id="settings-units"
      title="Units"
      intro="Only what people read changes: sizes, recipes and pitchers are kept in millilitres."
      status={status}
      saving={save.isPending}
      onSubmit={form.handleSubmit((v) => {
        setStatus(null);
        save.mutate(v, { onError: (e) => setStatus({ ok: false, text: showServerErrors(e, form.setError, {}) }) });
      })}
    >
      <Controller
        control={form.control}
        name="volumeUnit"
        render={({ field }) => (
          <Segmented
            label="Cup sizes in"
            value={field.value}
            onChange={field.onChange}
            options={VOLUME_UNITS.map((u) => ({ value: u, label: VOLUME_UNIT_LABEL[u] }))}
          />
        )}
      />
      <div>
        <h3 className="text-base font-semibold">Your cup sizes will read</h3>
        <ScrollBox label="Cup sizes table">
          <table className="mt-1 w-full text-left text-base" data-testid="cup-size-preview">
            <thead className="text-sm text-ink-600">
              <tr>
                <th className="py-1 font-semibold">Size</th>
                <th className="py-1 font-semibold">Stored</th>
                <th className="py-1 font-semibold">Shown as</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-steam-200">
              {cupSizes.map((c) => (
                <tr key={c.volumeMl}>
                  <td className="py-1">{c.names.join(', ')}</td>
                  <td className="py-1">{c.volumeMl} ml</td>
                  <td className="py-1 font-semibold">
                    {volume === 'us_floz' ? `${cupSizeLabel(c.volumeMl, 'us_floz')} = ${c.volumeMl} ml` : cupSizeLabel(c.volumeMl, 'ml')}
                    {volume === 'us_floz' && <span className="ml-2 text-sm font-medium text-ink-600">({exactUsFlOz(c.volumeMl)})</span>}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollBox>
        {volume === 'us_floz' && (
          <p className="mt-1 text-sm text-ink-600">
            US fluid ounces of 29.5735 ml, rounded to the nearest half ounce as cups are sold (12 oz is 354.9 ml) — not the 30 ml ounce of nutrition labels.
          </p>
        )}
      </div>
      <Controller
        control={form.control}
        name="temperatureUnit"
        render={({ field }) => (
          <Segmented
            label="Temperatures in"
            value={field.value}
            onChange={field.onChange}
            options={TEMPERATURE_UNITS.map((u) => ({ value: u, label: TEMPERATURE_UNIT_LABEL[u] }))}
          />
        )}
      />
      <p role="note" className="rounded-lg border-2 border-ink-900 px-3 py-2 text-base" data-testid="steam-note">
        <strong>⚠ Hot milk and steam.</strong> {hotMilkNote(temperature, true)} The Bar's caution line uses this unit.
      </p>
    </SettingsSection>
  );
}
