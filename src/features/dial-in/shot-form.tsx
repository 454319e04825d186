// Log a test shot: grind, dose, yield, time, a taste note. Big fields for a tablet on the bar;
// numbers open the decimal keypad and take "18,5" as well as "18.5".
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { dialInShotBody } from '@/domain/beans-schemas';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { useHydrated } from '@/lib/use-hydrated';

const shotFields = dialInShotBody.omit({ lotId: true });
export type ShotFields = z.infer<typeof shotFields>;

const decimal = (v: unknown) => (v === '' || v === undefined || v === null ? undefined : Number(String(v).trim().replace(',', '.')));
const big = 'mt-1 block min-h-16 w-full rounded-xl border-2 border-steam-200 bg-white px-4 font-display text-4xl font-semibold tabular-nums';
const label = 'block text-base font-semibold tracking-widest text-ink-600 uppercase';

export function ShotForm({ defaults, busy, onLog }: { defaults: Partial<ShotFields>; busy: boolean; onLog(v: ShotFields): void }) {
  const hydrated = useHydrated();
  const { register, handleSubmit, formState } = useForm<ShotFields>({ resolver: zodResolver(shotFields), defaultValues: defaults });
  const e = formState.errors;
  const num = { setValueAs: decimal } as const;
  return (
    <form
      aria-label="Log a test shot"
      onSubmit={handleSubmit(onLog)}
      noValidate
      className="grid grid-cols-2 gap-4 rounded-2xl sm:grid-cols-4 border border-steam-200 bg-white p-5"
    >
      <label>
        <span className={label}>Grind</span>
        <input className={big} autoComplete="off" inputMode="decimal" {...register('grind')} aria-invalid={!!e.grind} />
        <FieldError message={e.grind?.message} />
      </label>
      <label>
        <span className={label}>Dose in (g)</span>
        <input className={big} autoComplete="off" inputMode="decimal" {...register('doseG', num)} aria-invalid={!!e.doseG} />
        <FieldError message={e.doseG?.message} />
      </label>
      <label>
        <span className={label}>Yield out (g)</span>
        <input className={big} autoComplete="off" inputMode="decimal" {...register('yieldG', num)} aria-invalid={!!e.yieldG} />
        <FieldError message={e.yieldG?.message} />
      </label>
      <label>
        <span className={label}>Time (s)</span>
        <input className={big} autoComplete="off" inputMode="decimal" {...register('timeS', num)} aria-invalid={!!e.timeS} />
        <FieldError message={e.timeS?.message} />
      </label>
      <label className="col-span-2 sm:col-span-3">
        <span className={label}>Taste (optional)</span>
        <input
          className="mt-1 block min-h-14 w-full rounded-xl border-2 border-steam-200 bg-white px-4 text-xl"
          {...register('tasteNote')}
          placeholder="e.g. sour, thin; sweet, syrupy"
        />
        <FieldError message={e.tasteNote?.message} />
      </label>
      <div className="col-span-2 flex items-end sm:col-span-1">
        <Button type="submit" size="xl" className="w-full" disabled={busy || !hydrated}>
          Log shot
        </Button>
      </div>
    </form>
  );
}
