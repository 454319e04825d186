// Allergens: which published list the Counter offers and the menu is tagged with. Switching asks
// the owner what each tag the new list lacks becomes (the server refuses with 409 until then).
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { z } from 'zod';
import type { AllergenList } from '../../domain/allergens';
import { listOf, SETTINGS_FIELDS, type AllergenSwitchConflict, type SettingsView } from '../../domain/settings-schemas';
import { Button } from '../../components/ui/button';
import { Segmented } from '../../components/ui/segmented';
import { ApiError } from '../../lib/http';
import { settingsCommands } from '../../lib/settings-api';
import { SaveStatusText, SettingsSection, type SaveStatus } from './section';
import { showServerErrors } from './server-errors';
import { useSettingsCommand } from './use-settings-command';

const allergenForm = z.object({ allergenList: SETTINGS_FIELDS.allergenList });
type AllergenForm = z.infer<typeof allergenForm>;

const SOURCES: Record<AllergenList, string> = {
  US: 'US major food allergens: FALCPA 2004 and the FASTER Act 2021 (sesame)',
  EU: 'Regulation (EU) No 1169/2011, Annex II',
};
const KIND: Record<AllergenSwitchConflict['unlisted'][number]['kind'], string> = { milk: 'milk', modifier: 'extra', item: 'menu item' };
const REMOVE = '__remove__';

function isSwitchConflict(e: unknown): e is ApiError & { details: AllergenSwitchConflict } {
  return e instanceof ApiError && e.status === 409 && !!e.details && 'unlisted' in (e.details as object);
}

/** The tags the new list lacks, each with the owner's choice (prefilled from the published equivalents). */
function RetagPanel({ conflict, busy, onSwitch, onCancel }: { conflict: AllergenSwitchConflict; busy: boolean; onSwitch(choice: Record<string, string | null>): void; onCancel(): void }) {
  const [choice, setChoice] = useState<Record<string, string>>(() =>
    Object.fromEntries(Object.entries(conflict.suggestions).map(([tag, to]) => [tag, to ?? ''])),
  );
  const tags = Object.keys(conflict.suggestions);
  const ready = tags.every((t) => choice[t]);
  return (
    <div role="group" aria-label="Tags to change" className="rounded-xl border-2 border-ink-900 p-4" data-testid="retag-panel">
      <p className="text-lg font-semibold">
        {conflict.unlisted.length} menu {conflict.unlisted.length === 1 ? 'entry has' : 'entries have'} tags the {conflict.to} list does not name:
      </p>
      <ul className="mt-1 list-disc pl-6 text-base">
        {conflict.unlisted.map((u) => (
          <li key={`${u.kind}:${u.id}`}>
            <strong>{u.name}</strong> ({KIND[u.kind]}): {u.tags.join(', ')}
          </li>
        ))}
      </ul>
      <p className="mt-3 text-base">Choose what each tag becomes on the {conflict.to} list:</p>
      <div className="mt-2 flex flex-col gap-2">
        {tags.map((tag) => (
          <label key={tag} className="flex flex-wrap items-center gap-3">
            <span className="w-56 font-semibold">“{tag}” becomes</span>
            <select
              className="min-h-11 rounded-lg border border-steam-200 bg-white px-3 text-lg"
              value={choice[tag]}
              onChange={(e) => setChoice({ ...choice, [tag]: e.target.value })}
            >
              <option value="">Choose…</option>
              {listOf(conflict.to).map((a) => (
                <option key={a} value={a}>
                  {a}
                </option>
              ))}
              <option value={REMOVE}>no tag (not on the {conflict.to} list)</option>
            </select>
            {conflict.suggestions[tag] === null && <span className="text-sm text-ink-600">no equivalent on the {conflict.to} list — you decide</span>}
          </label>
        ))}
      </div>
      <div className="mt-3 flex flex-wrap gap-3">
        <Button
          disabled={!ready || busy}
          onClick={() => onSwitch(Object.fromEntries(tags.map((t) => [t, choice[t] === REMOVE ? null : choice[t]])))}
        >
          Switch to the {conflict.to} list and retag
        </Button>
        <Button tone="quiet" onClick={onCancel}>
          Keep the current list
        </Button>
      </div>
    </div>
  );
}

export function AllergensSection({ settings }: { settings: SettingsView }) {
  const form = useForm<AllergenForm>({ resolver: zodResolver(allergenForm), defaultValues: { allergenList: settings.allergenList } });
  const [status, setStatus] = useState<SaveStatus>(null);
  const [conflict, setConflict] = useState<AllergenSwitchConflict | null>(null);
  const save = useSettingsCommand(settingsCommands.update, (p) => {
    form.reset({ allergenList: p.settings.allergenList });
    setConflict(null);
    setStatus({ ok: true, text: `Saved — the Counter offers the ${p.settings.allergenList} list` });
  });
  const chosen = form.watch('allergenList');
  const send = (body: { allergenList: AllergenList; allergenRetag?: Record<string, string | null> }) => {
    setStatus(null);
    save.mutate(body, {
      onError: (e) => {
        if (isSwitchConflict(e)) {
          setConflict(e.details);
          setStatus({ ok: false, text: 'Not switched yet: choose what the tags below become' });
        } else setStatus({ ok: false, text: showServerErrors(e, form.setError, { allergenList: 'allergenList' }) });
      },
    });
  };
  return (
    <SettingsSection
      id="settings-allergens"
      title="Allergens"
      intro="The published list the Counter's allergy picker offers and the menu's tags use. Follow the law where the café trades."
      status={status}
      saving={save.isPending}
      saveHidden={!!conflict}
      onSubmit={form.handleSubmit((v) => send({ allergenList: v.allergenList }))}
    >
      <Controller
        control={form.control}
        name="allergenList"
        render={({ field }) => (
          <Segmented
            label="Allergen list"
            value={field.value}
            onChange={(v) => {
              setConflict(null);
              field.onChange(v);
            }}
            options={[
              { value: 'US', label: 'US list', hint: '9 allergens' },
              { value: 'EU', label: 'EU list', hint: '14 allergens' },
            ]}
          />
        )}
      />
      <p className="text-base">
        <span className="font-semibold">{SOURCES[chosen]}:</span> {listOf(chosen).join(', ')}.
      </p>
      {chosen !== settings.allergenList && (
        <p role="note" className="rounded-lg border-2 border-ink-900 px-3 py-2 text-base">
          <strong>⚠ Check the menu after switching.</strong> Switching only renames tags; it adds none. The {chosen} list names allergens the{' '}
          {settings.allergenList} list does not
          {chosen === 'EU' ? ' — oat milk is a cereal containing gluten; also celery, mustard, sulphites, lupin and molluscs' : ''}. Tag them in
          Menu, and follow your local food code.
        </p>
      )}
      {conflict && (
        <>
          <SaveStatusText status={status} />
          <RetagPanel conflict={conflict} busy={save.isPending} onSwitch={(choice) => send({ allergenList: conflict.to, allergenRetag: choice })} onCancel={() => {
            setConflict(null);
            setStatus(null);
            form.reset({ allergenList: settings.allergenList });
          }} />
        </>
      )}
    </SettingsSection>
  );
}
