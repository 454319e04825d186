// Pitchers: the sizes the Bar's jug plan chooses from, each with its fill line (how much cold
// milk it takes and still leaves room to stretch) and its minimum fill (the least that covers the
// steam tip). A fill line at the brim is warned about: the milk has no room left to grow. The
// last pitcher can't be removed.
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { defaultMinFillMl, PITCHER_CAPACITY_ML, pitcherBody, type PitcherBody, type PitcherView, type SettingsPage } from '@/domain/settings-schemas';
import { exactUsFlOz, type VolumeUnit } from '@/domain/units';
import { Button } from '@/components/ui/button';
import { cn } from '@/lib/cn';
import { send } from '@/lib/commands';
import { Field, SaveStatusText, type SaveStatus } from './section';
import { showServerErrors } from './server-errors';
import { useSettingsCommand } from './use-settings-command';

const SERVER_FIELDS = { capacityMl: 'capacityMl', fillLineMl: 'fillLineMl', minFillMl: 'minFillMl' } as const;
const number = { valueAsNumber: true } as const;
/** Left empty, the minimum is the usual one (the server fills it in). */
const optionalNumber = { setValueAs: (v: unknown) => (v === '' || v === undefined ? undefined : Number(v)) } as const;
const ok = (n: number) => Number.isFinite(n) && n > 0;

/**
 * What the owner should know about a fill line: at the brim there is no room for the milk to grow
 * (warned); above what foamy milk can grow from, the plan fills less for a foamy jug (said).
 */
function fillLineNote(capacityMl: number, fillLineMl: number, foamyPct: number): { warn: boolean; text: string } | null {
  if (!ok(capacityMl) || !ok(fillLineMl)) return null;
  const foamyMax = Math.floor((capacityMl * 100) / (100 + foamyPct));
  if (fillLineMl >= capacityMl)
    return {
      warn: true,
      text: `The fill line is the brim. Cold milk goes to just below the base of the spout, leaving room to grow when steamed; the jug plan fills this pitcher to at most ${foamyMax} ml for a foamy jug.`,
    };
  if (fillLineMl > foamyMax)
    return { warn: false, text: `Foamy milk grows about ${foamyPct} %: for a foamy jug the plan fills this pitcher to at most ${foamyMax} ml.` };
  return null;
}

/** Common practice: just below the base of the spout, about half to two-thirds of the capacity. */
const usualFill = (capacityMl: number) => `${Math.round(capacityMl / 2)}–${Math.round((capacityMl * 2) / 3)} ml`;

function PitcherForm({
  pitcher,
  unit,
  foamyPct,
  canRemove,
  report,
}: {
  pitcher: PitcherView | null;
  unit: VolumeUnit;
  foamyPct: number;
  canRemove: boolean;
  report(status: SaveStatus): void;
}) {
  const values = (p: PitcherView | null | undefined) => (p ? { capacityMl: p.capacityMl, fillLineMl: p.fillLineMl, minFillMl: p.minFillMl } : undefined);
  const form = useForm<PitcherBody>({ resolver: zodResolver(pitcherBody), defaultValues: values(pitcher) });
  // a saved row is remounted with its new values (its key changes); the new-pitcher row empties
  const done = (text: string) => () => {
    if (!pitcher) form.reset();
    report({ ok: true, text });
  };
  const save = useSettingsCommand(
    (body: PitcherBody) => (pitcher ? send.updatePitcher({ id: pitcher.id, ...body }) : send.addPitcher(body)),
    done(pitcher ? 'Pitcher saved — open Bars plan with it now' : 'Pitcher added — open Bars plan with it now'),
  );
  const remove = useSettingsCommand(
    () => send.removePitcher({ id: pitcher!.id }),
    () => report({ ok: true, text: 'Pitcher removed' }),
  );
  const fail = (e: unknown) => report({ ok: false, text: showServerErrors(e, form.setError, SERVER_FIELDS) });
  const errors = form.formState.errors;
  const capacity = form.watch('capacityMl');
  const fillLine = form.watch('fillLineMl');
  const note = fillLineNote(capacity, fillLine, foamyPct);
  const label = pitcher ? `Pitcher of ${pitcher.capacityMl} ml` : 'New pitcher';
  const busy = save.isPending || remove.isPending;

  return (
    <form
      aria-label={label}
      data-testid={pitcher ? 'pitcher' : 'new-pitcher'}
      noValidate
      className="flex flex-wrap items-start gap-3 py-3"
      onSubmit={form.handleSubmit((v) => {
        report(null);
        save.mutate(v, { onError: fail });
      })}
    >
      <Field
        label="Capacity (ml)"
        help={
          Number.isFinite(capacity) && capacity > 0
            ? unit === 'us_floz'
              ? exactUsFlOz(capacity)
              : `${PITCHER_CAPACITY_ML.min}–${PITCHER_CAPACITY_ML.max} ml`
            : `${PITCHER_CAPACITY_ML.min}–${PITCHER_CAPACITY_ML.max} ml`
        }
        error={errors.capacityMl?.message}
      >
        {(p) => <input {...p} {...form.register('capacityMl', number)} inputMode="numeric" className={cn(p.className, 'w-32')} />}
      </Field>
      <Field
        label="Fill line (ml)"
        help={Number.isFinite(capacity) && capacity > 0 ? `usually about ${usualFill(capacity)}` : 'cold milk it takes'}
        error={errors.fillLineMl?.message}
      >
        {(p) => <input {...p} {...form.register('fillLineMl', number)} inputMode="numeric" className={cn(p.className, 'w-32')} />}
      </Field>
      <Field
        label="Minimum fill (ml)"
        help={ok(capacity) && ok(fillLine) ? `covers the steam tip; usually about a third: ${defaultMinFillMl(capacity, fillLine)} ml` : 'covers the steam tip'}
        error={errors.minFillMl?.message}
      >
        {(p) => <input {...p} {...form.register('minFillMl', optionalNumber)} inputMode="numeric" className={cn(p.className, 'w-32')} />}
      </Field>
      <div className="mt-7 flex gap-2">
        <Button type="submit" tone={pitcher ? 'quiet' : 'primary'} disabled={busy}>
          {pitcher ? 'Save pitcher' : 'Add pitcher'}
        </Button>
        {pitcher && (
          <Button
            tone="quiet"
            disabled={busy || !canRemove}
            title={canRemove ? undefined : 'The Bar needs at least one pitcher'}
            onClick={() => {
              report(null);
              remove.mutate(undefined, { onError: fail });
            }}
          >
            Remove
          </Button>
        )}
      </div>
      {note && (
        <p
          data-testid="fill-line-note"
          role={note.warn ? 'alert' : undefined}
          className={cn('basis-full text-base', note.warn ? 'font-semibold text-copper-700' : 'text-ink-600')}
        >
          {note.warn && <span aria-hidden>⚠ </span>}
          {note.text}
        </p>
      )}
    </form>
  );
}

export function PitchersSection({ page }: { page: SettingsPage }) {
  const [status, setStatus] = useState<SaveStatus>(null);
  const { pitchers, settings } = page;
  return (
    <section aria-labelledby="settings-pitchers" className="flex flex-col gap-2 rounded-2xl border border-steam-200 bg-white p-5">
      <h2 id="settings-pitchers" className="text-2xl font-semibold">
        Pitchers
      </h2>
      <p className="text-base text-ink-600">
        The jug plan takes the smallest pitcher that holds a jug: its cold milk at or under the fill line and at or over the minimum, and that milk, grown as it
        is steamed, still inside the pitcher. The fill line is the cold milk that still leaves room to stretch it: by common practice just below the base of the
        spout, about half to two-thirds of the capacity. The minimum covers the steam tip, about a third. A jug whose drinks need less is poured at the minimum,
        the rest shown as waste. Measure your own.
      </p>
      <div className="divide-y divide-steam-200">
        {pitchers.map((p) => (
          <PitcherForm
            key={`${p.id}:${p.capacityMl}:${p.fillLineMl}:${p.minFillMl}`}
            pitcher={p}
            unit={settings.volumeUnit}
            foamyPct={settings.expansionFoamyPct}
            canRemove={pitchers.length > 1}
            report={setStatus}
          />
        ))}
        <PitcherForm pitcher={null} unit={settings.volumeUnit} foamyPct={settings.expansionFoamyPct} canRemove={false} report={setStatus} />
      </div>
      <SaveStatusText status={status} />
    </section>
  );
}
