// Allergens: which published list the Counter offers and the menu's allergens are read under. The
// menu records ingredients, so a switch rewrites nothing; choosing the other list shows, per milk,
// item and extra, what it contains under the current list and under the new one, and the owner
// confirms with the section's save.
import { ScrollBox } from '@/components/ui/scroll-box';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { z } from 'zod';
import type { AllergenSwitchPreview, MenuEntryKind } from '@/domain/allergen-switch';
import { allergensOf, type AllergenList } from '@/domain/allergens';
import { ALLERGEN_CAUTION } from '@/domain/ingredients';
import { SETTINGS_FIELDS, type SettingsPage } from '@/domain/settings-schemas';
import { Segmented } from '@/components/ui/segmented';
import { send } from '@/lib/commands';
import { SettingsSection, type SaveStatus } from './section';
import { showServerErrors } from './server-errors';
import { useSettingsCommand } from './use-settings-command';

const allergenForm = z.object({ allergenList: SETTINGS_FIELDS.allergenList });
type AllergenForm = z.infer<typeof allergenForm>;

const SOURCES: Record<AllergenList, string> = {
  US: 'US major food allergens: FALCPA 2004 and the FASTER Act 2021 (sesame)',
  EU: 'Regulation (EU) No 1169/2011, Annex II',
};
const KIND: Record<MenuEntryKind, string> = { milk: 'milk', extra: 'extra', item: 'item' };
const listed = (allergens: string[]) => (allergens.length ? allergens.join(', ') : 'none');

/** What the switch changes, entry by entry, before the owner confirms it. */
function SwitchPreview({ preview }: { preview: AllergenSwitchPreview }) {
  const { from, to, changed, unchanged, toCheck } = preview;
  const th = 'border-b-2 border-steam-200 px-2 py-1 text-left text-sm font-semibold tracking-wide text-ink-600 uppercase';
  const td = 'border-b border-steam-200 px-2 py-2 align-top';
  return (
    <div
      role="group"
      aria-label={`What the ${to} list changes`}
      className="flex flex-col gap-3 rounded-xl border-2 border-ink-900 p-4"
      data-testid="allergen-switch"
    >
      <p className="text-lg font-semibold">
        {changed.length === 0
          ? `Every milk, item and extra reads the same on the ${to} list.`
          : `${changed.length} of ${changed.length + unchanged} on the menu read differently on the ${to} list:`}
      </p>
      {changed.length > 0 && (
        <ScrollBox label="Allergens table">
          <table className="w-full border-collapse text-base">
            <thead>
              <tr>
                <th className={th}>On the menu</th>
                <th className={th}>Made with</th>
                <th className={th}>{from} list now</th>
                <th className={th}>{to} list</th>
              </tr>
            </thead>
            <tbody>
              {changed.map((c) => (
                <tr key={`${c.kind}:${c.id}`} data-testid="switch-row">
                  <td className={td}>
                    <strong>{c.name}</strong> <span className="text-ink-600">({KIND[c.kind]})</span>
                  </td>
                  <td className={td}>{c.ingredients.join(', ')}</td>
                  <td className={td}>{listed(c.before)}</td>
                  <td className={`${td} font-semibold`}>{listed(c.after)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollBox>
      )}
      {changed.length > 0 && unchanged > 0 && <p className="text-base text-ink-600">The other {unchanged} read the same on both lists.</p>}
      {toCheck.length > 0 && (
        <div role="note" className="text-base">
          <p className="font-semibold">⚠ Check these in Menu: their ingredients don't say enough to be sure.</p>
          <ul className="list-disc pl-6">
            {toCheck.map((c) => (
              <li key={`${c.kind}:${c.id}`}>
                <strong>{c.name}</strong> ({KIND[c.kind]}): {c.reason}
              </li>
            ))}
          </ul>
        </div>
      )}
      <p className="text-sm text-ink-600">Nothing on the menu is rewritten: the allergens are read from the ingredients under the list in use.</p>
    </div>
  );
}

export function AllergensSection({ page }: { page: SettingsPage }) {
  const { settings, allergenSwitch } = page;
  const form = useForm<AllergenForm>({ resolver: zodResolver(allergenForm), defaultValues: { allergenList: settings.allergenList } });
  const [status, setStatus] = useState<SaveStatus>(null);
  const save = useSettingsCommand(send.updateSettings, (p) => {
    form.reset({ allergenList: p.settings.allergenList });
    setStatus({ ok: true, text: `Saved — the Counter and the menu use the ${p.settings.allergenList} list` });
  });
  const chosen = form.watch('allergenList');
  const switching = chosen !== settings.allergenList && allergenSwitch.to === chosen;
  return (
    <SettingsSection
      id="settings-allergens"
      title="Allergens"
      intro="The published list the Counter's allergy picker offers and the menu's allergens are read under. Follow the law where the café trades."
      status={status}
      saving={save.isPending}
      saveLabel={switching ? `Switch to the ${chosen} list` : 'Save'}
      onSubmit={form.handleSubmit((v) => {
        setStatus(null);
        save.mutate(
          { allergenList: v.allergenList },
          { onError: (e) => setStatus({ ok: false, text: showServerErrors(e, form.setError, { allergenList: 'allergenList' }) }) },
        );
      })}
    >
      <Controller
        control={form.control}
        name="allergenList"
        render={({ field }) => (
          <Segmented
            label="Allergen list"
            value={field.value}
            onChange={field.onChange}
            options={[
              { value: 'US', label: 'US list', hint: '9 allergens' },
              { value: 'EU', label: 'EU list', hint: '14 allergens' },
            ]}
          />
        )}
      />
      <p className="text-base">
        <span className="font-semibold">{SOURCES[chosen]}:</span> {allergensOf(chosen).join(', ')}.
      </p>
      {switching && <SwitchPreview preview={allergenSwitch} />}
      <p role="note" className="text-sm text-ink-600">
        ⚠ {ALLERGEN_CAUTION}
      </p>
    </SettingsSection>
  );
}
