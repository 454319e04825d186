// Add or edit a bean lot. The same zod schema as the route; the server's own field errors (a date
// after today) land on their fields too.
import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm, type FieldPath } from 'react-hook-form';
import { HOPPER_LABEL, HOPPERS, type BeanLotView, type Hopper } from '@/domain/bean-stock';
import { beanLotBody, type BeanLotBody } from '@/domain/beans-schemas';
import { daysBetween, DEFAULT_FRESHNESS, freshnessState } from '@/domain/freshness';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { useHydrated } from '@/lib/use-hydrated';
import { Segmented } from '@/components/ui/segmented';
import { send } from '@/lib/commands';
import { ApiError } from '@/lib/http';
import { cn } from '@/lib/cn';
import { beanKeys } from '@/queries/beans';

const input = 'mt-1 block min-h-12 w-full rounded-lg border border-steam-200 bg-white px-3 text-lg';
const label = 'block text-sm font-semibold tracking-widest text-ink-600 uppercase';

function defaults(lot: BeanLotView | null, today: string): BeanLotBody {
  if (!lot) {
    return { name: '', roaster: '', origin: '', notes: '', roastDate: today, receivedDate: today, receivedG: 1000, hopper: 'shelf', ...DEFAULT_FRESHNESS };
  }
  const { name, roaster, roastDate, receivedDate, receivedG, hopper, restDays, bestUntilDays } = lot;
  return { name, roaster, origin: lot.origin ?? '', notes: lot.notes ?? '', roastDate, receivedDate, receivedG, hopper, restDays, bestUntilDays };
}

const FIELDS = ['name', 'roaster', 'origin', 'notes', 'roastDate', 'receivedDate', 'receivedG', 'hopper', 'restDays', 'bestUntilDays'] as const;

/** `notice`: what happened, said after a save (which lot went where, which moved to the shelf). */
export function LotForm({ lot, lots, today, onDone }: { lot: BeanLotView | null; lots: BeanLotView[]; today: string; onDone(notice?: string): void }) {
  const qc = useQueryClient();
  const hydrated = useHydrated();
  const form = useForm<BeanLotBody>({ resolver: zodResolver(beanLotBody), defaultValues: defaults(lot, today) });
  const { register, formState, setError, watch, setValue, handleSubmit } = form;
  const save = useMutation({
    mutationFn: (body: BeanLotBody) => (lot ? send.updateLot({ id: lot.id, ...body }) : send.createLot(body)),
    onSuccess: async (_, body) => {
      // named before the refetch: afterwards the grinder holds the lot just saved
      const moved = displaced?.name;
      await qc.invalidateQueries({ queryKey: beanKeys.all });
      setMoving(null);
      const where = body.hopper === 'shelf' ? 'on the shelf' : `to the ${HOPPER_LABEL[body.hopper].toLowerCase()} grinder`;
      onDone(`${lot ? 'Saved' : 'Added'} ${body.name} ${where}.${moved ? ` ${moved} moved to the shelf.` : ''}`);
    },
    onError: (err) => {
      if (!(err instanceof ApiError)) return;
      for (const d of err.details ?? []) if ((FIELDS as readonly string[]).includes(d.path)) setError(d.path as FieldPath<BeanLotBody>, { message: d.message });
    },
  });
  // the body waiting for the owner to agree that the grinder's lot goes to the shelf
  const [moving, setMoving] = useState<BeanLotBody | null>(null);
  const hopper = watch('hopper');
  const displaced = hopper !== 'shelf' ? lots.find((l) => l.hopper === hopper && !l.retiredAt && l.id !== lot?.id) : undefined;
  const [roastDate, restDays, bestUntilDays] = watch(['roastDate', 'restDays', 'bestUntilDays']);
  const age = /^\d{4}-\d{2}-\d{2}$/.test(roastDate ?? '') ? daysBetween(roastDate, today) : null;
  const state =
    age !== null && age >= 0 && Number.isFinite(restDays) && Number.isFinite(bestUntilDays) ? freshnessState(age, { restDays, bestUntilDays }) : null;
  const err = (f: (typeof FIELDS)[number]) => formState.errors[f]?.message;
  const number = { valueAsNumber: true } as const;
  const title = lot ? `Edit ${lot.name}` : 'Add a lot';

  return (
    <form
      aria-label={title}
      onSubmit={handleSubmit((v) => (displaced ? setMoving(v) : save.mutate(v)))}
      className="grid grid-cols-4 gap-4 rounded-2xl border border-steam-200 bg-white p-5"
      noValidate
    >
      <h2 className="col-span-4 text-2xl font-semibold">{title}</h2>
      <label className="col-span-2">
        <span className={label}>Name</span>
        <input className={input} {...register('name')} aria-invalid={!!err('name')} />
        <FieldError message={err('name')} />
      </label>
      <label className="col-span-2">
        <span className={label}>Roaster</span>
        <input className={input} {...register('roaster')} aria-invalid={!!err('roaster')} />
        <FieldError message={err('roaster')} />
      </label>
      <label className="col-span-2">
        <span className={label}>Origin and tasting notes</span>
        <input className={input} {...register('origin')} placeholder="e.g. Colombia, washed; cocoa" />
        <FieldError message={err('origin')} />
      </label>
      <label className="col-span-2">
        <span className={label}>Notes</span>
        <input className={input} {...register('notes')} placeholder="e.g. order more on Mondays" />
        <FieldError message={err('notes')} />
      </label>
      <label>
        <span className={label}>Roast date</span>
        <input type="date" className={input} max={today} {...register('roastDate')} aria-invalid={!!err('roastDate')} />
        <FieldError message={err('roastDate')} />
      </label>
      <label>
        <span className={label}>Received</span>
        <input type="date" className={input} max={today} {...register('receivedDate')} aria-invalid={!!err('receivedDate')} />
        <FieldError message={err('receivedDate')} />
      </label>
      <label>
        <span className={label}>Weight received (g)</span>
        <input inputMode="numeric" className={input} {...register('receivedG', number)} aria-invalid={!!err('receivedG')} />
        <FieldError message={err('receivedG')} />
      </label>
      <div className="flex gap-3">
        <label className="flex-1">
          <span className={label}>Rest days</span>
          <input inputMode="numeric" className={input} {...register('restDays', number)} aria-invalid={!!err('restDays')} />
          <FieldError message={err('restDays')} />
        </label>
        <label className="flex-1">
          <span className={label}>Best until day</span>
          <input inputMode="numeric" className={input} {...register('bestUntilDays', number)} aria-invalid={!!err('bestUntilDays')} />
          <FieldError message={err('bestUntilDays')} />
        </label>
      </div>
      <div className="col-span-4">
        <Segmented<Hopper>
          label="Grinder"
          options={HOPPERS.map((h) => ({ value: h, label: HOPPER_LABEL[h] }))}
          value={hopper}
          onChange={(h) => setValue('hopper', h, { shouldDirty: true })}
        />
        {displaced && (
          <p role="status" className="mt-2 text-base">
            <span aria-hidden>⇄ </span>
            {displaced.name} is in the {HOPPER_LABEL[hopper].toLowerCase()} grinder now; saving moves it to the shelf.
          </p>
        )}
        {hopper !== 'shelf' && (state === 'resting' || state === 'fading') && (
          // a caution, not a rule: the owner may have good reasons (a rush, the last bag)
          <p role="note" data-testid="grinder-caution" className="mt-2 rounded-lg border-2 border-ink-900 px-3 py-2 text-base">
            <span aria-hidden>⚠ </span>
            {state === 'resting'
              ? `Roasted ${age} day${age === 1 ? '' : 's'} ago: still resting until day ${restDays}. Fresh beans are still degassing and shots tend to run uneven; dial in before service.`
              : `Roasted ${age} days ago: past its best (day ${bestUntilDays}). Expect flatter shots; dial in again.`}
          </p>
        )}
        <p className="mt-2 text-sm text-ink-600">
          Bumped drinks take their recipe dose from the lot in the espresso grinder (from the decaf grinder when the drink has a decaf extra). Freshness is
          common practice: resting under {DEFAULT_FRESHNESS.restDays} days, best to day {DEFAULT_FRESHNESS.bestUntilDays}; set each lot's own.
        </p>
      </div>
      {moving && displaced && (
        <div
          role="group"
          aria-label="Move a lot to the shelf"
          className="col-span-4 flex flex-wrap items-center gap-3 rounded-xl border-2 border-ink-900 px-4 py-3"
        >
          <p className="text-lg">
            <span aria-hidden>⇄ </span>
            {displaced.name} is in the {HOPPER_LABEL[hopper].toLowerCase()} grinder. Put {moving.name} in and move {displaced.name} to the shelf?
          </p>
          <Button size="lg" disabled={save.isPending} onClick={() => save.mutate(moving)}>
            Yes, move {displaced.name} to the shelf
          </Button>
          <Button tone="quiet" size="lg" onClick={() => setMoving(null)}>
            Back
          </Button>
        </div>
      )}
      <div className={cn('col-span-4 flex flex-wrap items-center gap-3', moving && 'hidden')}>
        <Button type="submit" size="lg" disabled={save.isPending || !hydrated}>
          {lot ? 'Save lot' : 'Add lot'}
        </Button>
        <Button tone="quiet" size="lg" onClick={() => onDone()}>
          Cancel
        </Button>
        {save.error && (
          <p role="alert" className="font-semibold text-copper-700">
            {save.error instanceof ApiError ? save.error.message : 'That did not work'}
          </p>
        )}
      </div>
    </form>
  );
}
