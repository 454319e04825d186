// The item form's sizes, each with its recipe: cup, price, shots, dose → target yield, milk.
// A stored size removed here is retired on save (after a confirmation), never deleted.
import { useState } from 'react';
import { useFieldArray, useWatch, type UseFormReturn } from 'react-hook-form';
import type { ItemBody, ItemFormValues } from '@/domain/menu-admin-schemas';
import type { AdminSize } from '@/domain/menu-admin-view';
import { ratioLabel } from '@/domain/format';
import { parseGramsToDg, parseWhole } from '@/domain/menu-units';
import { exactUsFlOz } from '@/domain/units';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { ConfirmRetire } from './dialog';
import { Field } from './fields';
import { sizeValues } from './item-values';

type Form = UseFormReturn<ItemFormValues, unknown, ItemBody>;

/** A new size starts with the espresso of the one before (sizes mostly differ in cup, milk and
 * price, not in the shots), so the owner doesn't type the dose and yield again. */
function nextSize(previous: ItemFormValues['sizes'][number] | undefined) {
  const blank = sizeValues(null, previous === undefined);
  return previous ? { ...blank, shots: previous.shots, doseG: previous.doseG, yieldG: previous.yieldG } : blank;
}

function RatioHint({ form, index }: { form: Form; index: number }) {
  const [dose, out] = useWatch({ control: form.control, name: [`sizes.${index}.doseG`, `sizes.${index}.yieldG`] });
  const ratio = ratioLabel(parseGramsToDg(dose ?? '') ?? 0, parseGramsToDg(out ?? '') ?? 0);
  return <>{ratio ? `Brew ratio ${ratio}` : 'Espresso out'}</>;
}

function VolumeHint({ form, index }: { form: Form; index: number }) {
  const ml = parseWhole(useWatch({ control: form.control, name: `sizes.${index}.volumeMl` }) ?? '');
  return <>{ml ? `= ${exactUsFlOz(ml)}` : 'What the cup holds'}</>;
}

export function SizeRows({ form, takesMilk, retired, sign }: { form: Form; takesMilk: boolean; retired: AdminSize[]; sign: string }) {
  const rows = useFieldArray({ control: form.control, name: 'sizes' });
  const [confirm, setConfirm] = useState<number | null>(null);
  const values = useWatch({ control: form.control, name: 'sizes' }) ?? [];
  const errors = form.formState.errors.sizes;
  const err = (i: number, f: keyof ItemFormValues['sizes'][number]) => errors?.[i]?.[f]?.message;
  const makeDefault = (i: number) => rows.fields.forEach((_, j) => form.setValue(`sizes.${j}.isDefault`, i === j, { shouldDirty: true }));
  const listed = new Set(values.map((v) => v.sizeId));
  const remove = (i: number) => (values[i]?.sizeId ? setConfirm(i) : rows.remove(i));

  return (
    <fieldset className="flex flex-col gap-3">
      <legend className="mb-2 text-xl font-semibold">Sizes and recipe</legend>
      <p className="-mt-1 text-base text-ink-600">
        Dose and target yield are for the size's shots together. {takesMilk ? 'Milk is the cold milk the recipe takes; the Bar adds it up per jug.' : ''}
      </p>
      <FieldError message={errors?.root?.message ?? errors?.message} />
      {rows.fields.map((row, i) => {
        const name = values[i]?.name || `Size ${i + 1}`;
        const p = `sizes.${i}` as const;
        return (
          <div key={row.id} data-testid="size-row" className="rounded-xl border border-steam-200 bg-white p-4">
            <div className="grid grid-cols-[1fr_1fr_1.3fr_1fr_auto] items-start gap-3">
              <Field label="Size name" placeholder="12 oz" error={err(i, 'name')} {...form.register(`${p}.name`)} id={`${p}.name`} />
              <Field
                label="Cup volume"
                unit="ml"
                inputMode="numeric"
                error={err(i, 'volumeMl')}
                hint={<VolumeHint form={form} index={i} />}
                {...form.register(`${p}.volumeMl`)}
                id={`${p}.volumeMl`}
              />
              <Field label="Cup" placeholder="12 oz hot cup" error={err(i, 'cup')} {...form.register(`${p}.cup`)} id={`${p}.cup`} />
              <Field
                label="Price"
                prefix={sign}
                inputMode="decimal"
                placeholder="5.60"
                error={err(i, 'price')}
                {...form.register(`${p}.price`)}
                id={`${p}.price`}
              />
              <label className="flex min-h-12 cursor-pointer items-center gap-2 self-end rounded-lg border-2 border-steam-200 px-3 text-base font-semibold has-checked:border-ink-900">
                <input type="radio" name="default-size" className="size-5 accent-copper-700" checked={!!values[i]?.isDefault} onChange={() => makeDefault(i)} />
                Default
              </label>
            </div>
            <div className="mt-3 grid grid-cols-[1fr_1fr_1fr_1fr_auto] items-start gap-3">
              <Field label="Shots" inputMode="numeric" error={err(i, 'shots')} {...form.register(`${p}.shots`)} id={`${p}.shots`} />
              <Field label="Dose" unit="g" inputMode="decimal" error={err(i, 'doseG')} hint="Coffee in" {...form.register(`${p}.doseG`)} id={`${p}.doseG`} />
              <Field
                label="Target yield"
                unit="g"
                inputMode="decimal"
                error={err(i, 'yieldG')}
                hint={<RatioHint form={form} index={i} />}
                {...form.register(`${p}.yieldG`)}
                id={`${p}.yieldG`}
              />
              {takesMilk ? (
                <Field
                  label="Milk"
                  unit="ml"
                  inputMode="numeric"
                  error={err(i, 'milkMl')}
                  hint="Cold, before steaming"
                  {...form.register(`${p}.milkMl`)}
                  id={`${p}.milkMl`}
                />
              ) : (
                <p className="self-center text-base text-ink-600">No milk</p>
              )}
              <div className="flex gap-1 self-end">
                <Button tone="quiet" className="w-11 px-0" aria-label={`Move ${name} up`} disabled={i === 0} onClick={() => rows.move(i, i - 1)}>
                  ↑
                </Button>
                <Button
                  tone="quiet"
                  className="w-11 px-0"
                  aria-label={`Move ${name} down`}
                  disabled={i === rows.fields.length - 1}
                  onClick={() => rows.move(i, i + 1)}
                >
                  ↓
                </Button>
                <Button tone="quiet" aria-label={`Remove ${name}`} onClick={() => remove(i)}>
                  Remove
                </Button>
              </div>
            </div>
          </div>
        );
      })}
      <div className="flex flex-wrap items-center gap-3">
        <Button tone="quiet" disabled={rows.fields.length >= 8} onClick={() => rows.append(nextSize(values[values.length - 1]))}>
          + Add a size
        </Button>
        {retired
          .filter((s) => !listed.has(s.id))
          .map((s) => (
            <Button key={s.id} tone="quiet" onClick={() => rows.append(sizeValues(s, false))}>
              Bring back {s.name} (retired)
            </Button>
          ))}
      </div>
      {confirm !== null && (
        <ConfirmRetire
          what={`size ${values[confirm]?.name}`}
          consequence="When you save the item, the Counter stops offering this size."
          busy={false}
          onCancel={() => setConfirm(null)}
          onConfirm={() => {
            rows.remove(confirm);
            setConfirm(null);
          }}
        />
      )}
    </fieldset>
  );
}
