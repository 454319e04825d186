// The location's dial-in window (shot time, brew ratio) and the low-stock line. The form takes
// the ratio as written on the bar ("1.8"); the API takes tenths.
import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import type { BeanSettingsView } from '@/domain/bean-stock';
import { beanSettingsBody } from '@/domain/beans-schemas';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { useHydrated } from '@/lib/use-hydrated';
import { send } from '@/lib/commands';
import { ApiError } from '@/lib/http';
import { beanKeys } from '@/queries/beans';

const decimal = (v: unknown) => (v === '' || v === undefined ? NaN : Number(String(v).replace(',', '.')));
const ratio = z.number('Enter a ratio like 2.0').min(0.5).max(5);
const form = z.object({
  timeMinS: z.number('Enter seconds'),
  timeMaxS: z.number('Enter seconds'),
  ratioMin: ratio,
  ratioMax: ratio,
  lowStockG: z.number('Enter grams'),
});
type Form = z.infer<typeof form>;

const formValues = (s: BeanSettingsView): Form => ({
  timeMinS: s.timeMinS,
  timeMaxS: s.timeMaxS,
  ratioMin: s.ratioMinX10 / 10,
  ratioMax: s.ratioMaxX10 / 10,
  lowStockG: s.lowStockG,
});

const input = 'mt-1 block min-h-12 w-28 rounded-lg border border-steam-200 bg-white px-3 text-lg';
const label = 'block text-sm font-semibold tracking-widest text-ink-600 uppercase';

export function BeanSettingsForm({ settings }: { settings: BeanSettingsView }) {
  const qc = useQueryClient();
  const hydrated = useHydrated();
  const { register, handleSubmit, formState, setError, reset } = useForm<Form>({ resolver: zodResolver(form), defaultValues: formValues(settings) });
  const save = useMutation({
    mutationFn: send.saveBeanSettings,
    onSuccess: async ({ settings: saved }) => {
      reset(formValues(saved));
      await qc.invalidateQueries({ queryKey: beanKeys.all });
    },
  });
  const submit = (v: Form) => {
    const body = {
      timeMinS: v.timeMinS,
      timeMaxS: v.timeMaxS,
      ratioMinX10: Math.round(v.ratioMin * 10),
      ratioMaxX10: Math.round(v.ratioMax * 10),
      lowStockG: v.lowStockG,
    };
    // the route's own schema, so the form says exactly what the server would
    const checked = beanSettingsBody.safeParse(body);
    if (!checked.success) {
      const to = { ratioMinX10: 'ratioMin', ratioMaxX10: 'ratioMax' } as Record<string, keyof Form>;
      for (const i of checked.error.issues) setError(to[String(i.path[0])] ?? (i.path[0] as keyof Form), { message: i.message });
      return;
    }
    save.mutate(checked.data);
  };
  const num = { setValueAs: decimal } as const;
  const e = formState.errors;
  return (
    <form
      aria-label="Dial-in window and low stock"
      onSubmit={handleSubmit(submit)}
      className="flex flex-wrap items-end gap-4 rounded-2xl border border-steam-200 bg-white p-5"
      noValidate
    >
      <h2 className="w-full text-xl font-semibold">Dial-in window and low stock</h2>
      <label>
        <span className={label}>Shot from (s)</span>
        <input inputMode="decimal" className={input} {...register('timeMinS', num)} />
        <FieldError message={e.timeMinS?.message} />
      </label>
      <label>
        <span className={label}>to (s)</span>
        <input inputMode="decimal" className={input} {...register('timeMaxS', num)} />
        <FieldError message={e.timeMaxS?.message} />
      </label>
      <label>
        <span className={label}>Ratio from 1:</span>
        <input inputMode="decimal" className={input} {...register('ratioMin', num)} />
        <FieldError message={e.ratioMin?.message} />
      </label>
      <label>
        <span className={label}>to 1:</span>
        <input inputMode="decimal" className={input} {...register('ratioMax', num)} />
        <FieldError message={e.ratioMax?.message} />
      </label>
      <label>
        <span className={label}>Low under (g)</span>
        <input inputMode="numeric" className={input} {...register('lowStockG', num)} />
        <FieldError message={e.lowStockG?.message} />
      </label>
      <Button type="submit" size="lg" disabled={save.isPending || !hydrated}>
        Save window
      </Button>
      {save.isSuccess && !formState.isDirty && <p role="status">Saved.</p>}
      {save.error && (
        <p role="alert" className="font-semibold text-copper-700">
          {save.error instanceof ApiError ? save.error.message : 'That did not work'}
        </p>
      )}
      <p className="w-full text-base text-ink-600">
        This is the café&rsquo;s own target for a good shot. The dose range comes from the house double recipe (its dose ± 1 g, or 18–22 g without one). A
        grinder&rsquo;s lot is also low when it has under a day of use left at the last week&rsquo;s pace.
      </p>
      <details className="w-full text-sm text-ink-600">
        <summary className="cursor-pointer underline underline-offset-4">Where the usual numbers come from</summary>
        <p className="mt-1">
          Common practice is about 1:2 (yield ÷ dose) in 25–30 s; the Italian espresso institute&rsquo;s certified espresso allows 25 ± 5 s.
        </p>
      </details>
    </form>
  );
}
