// The item form: name, category, station; milk and texture; sizes with their recipes; the item's
// ingredients (its allergens follow); which groups of extras it offers. Saved whole; retiring asks first.
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { itemForm, type ItemBody, type ItemFormValues } from '@/domain/menu-admin-schemas';
import type { AdminItem, AdminMenuView } from '@/domain/menu-admin-view';
import { TEXTURES } from '@/domain/types';
import { hotMilkNote } from '@/domain/cautions';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { Segmented } from '@/components/ui/segmented';
import type { MenuCommand } from './commands';
import { ConfirmRetire, Sheet } from './dialog';
import { CheckGroup, Field, IngredientPicker, inputClass } from './fields';
import { currencySign, TEXTURE_HINT } from './format';
import { itemValues } from './item-values';
import { showServerErrors } from './server-errors';
import { SizeRows } from './size-rows';

interface Props {
  menu: AdminMenuView;
  item: AdminItem | null;
  categoryId: number;
  command: MenuCommand;
  notify(message: string): void;
  onClose(): void;
}

const FIELDS = ['categoryId', 'name', 'station', 'price', 'takesMilk', 'defaultMilkId', 'texture', 'ingredients', 'extraGroupIds', 'sizes'];
const label = 'mb-1 block text-sm font-semibold tracking-wide text-ink-600 uppercase';

export function ItemForm({ menu, item, categoryId, command, notify, onClose }: Props) {
  const form = useForm<ItemFormValues, unknown, ItemBody>({ resolver: zodResolver(itemForm), defaultValues: itemValues(item, categoryId) });
  const [problem, setProblem] = useState<string | null>(null);
  const [confirmRetire, setConfirmRetire] = useState(false);
  const takesMilk = useWatch({ control: form.control, name: 'takesMilk' });
  const hasSizes = (useWatch({ control: form.control, name: 'sizes' }) ?? []).length > 0;
  const errors = form.formState.errors;
  const sign = currencySign(menu);
  const unit = menu.location.temperatureUnit;

  const save = form.handleSubmit(async (body) => {
    setProblem(null);
    try {
      await command.mutateAsync((c) => (item ? c.updateItem({ id: item.id, ...body }) : c.createItem(body)));
      notify(item ? `Saved ${body.name}. Open Counters show it now.` : `Added ${body.name}. Open Counters show it now.`);
      onClose();
    } catch (err) {
      setProblem(showServerErrors(err, form.setError, FIELDS));
    }
  });
  const retire = async () => {
    try {
      await command.mutateAsync((c) => c.setItemRetired({ id: item!.id, retired: true }));
      notify(`Retired ${item!.name}. It is off the Counter; past orders keep it.`);
      onClose();
    } catch (err) {
      setConfirmRetire(false);
      setProblem(err instanceof Error ? err.message : String(err));
    }
  };

  const categories = menu.categories.filter((c) => !c.retired || c.id === item?.categoryId);
  const milks = menu.milks.filter((m) => !m.retired || m.id === item?.defaultMilkId);
  const groups = menu.extraGroups.filter((g) => !g.retired || item?.extraGroupIds.includes(g.id));

  return (
    <Sheet
      wide
      title={item ? `Edit ${item.name}` : 'New item'}
      onClose={onClose}
      footer={
        <div className="flex items-center gap-3">
          {item && !item.retired && (
            <Button tone="quiet" size="lg" onClick={() => setConfirmRetire(true)}>
              Retire item…
            </Button>
          )}
          <div className="ml-auto flex items-center gap-3">
            {problem && (
              <p role="alert" className="max-w-md text-base font-semibold text-copper-700">
                ⚠ {problem}
              </p>
            )}
            {Object.keys(errors).length > 0 && !problem && <p className="text-base font-semibold text-copper-700">⚠ Some fields need fixing</p>}
            <Button size="lg" disabled={command.isPending} onClick={save}>
              {item ? 'Save item' : 'Add item'}
            </Button>
          </div>
        </div>
      }
    >
      <form onSubmit={save} noValidate className="flex flex-col gap-6" aria-label="Item">
        <div className="grid grid-cols-[2fr_1fr] gap-4">
          <Field label="Name" error={errors.name?.message} {...form.register('name')} id="item-name" />
          <div>
            <label htmlFor="item-category" className={label}>
              Category
            </label>
            <select id="item-category" className={inputClass} {...form.register('categoryId')}>
              {categories.map((c) => (
                <option key={c.id} value={String(c.id)}>
                  {c.name}
                  {c.retired ? ' (retired)' : ''}
                </option>
              ))}
            </select>
            <FieldError message={errors.categoryId?.message} />
          </div>
        </div>
        <div>
          <Controller
            control={form.control}
            name="station"
            render={({ field }) => (
              <Segmented
                label="Made at"
                value={field.value}
                onChange={field.onChange}
                options={[
                  { value: 'bar', label: 'Bar', hint: 'goes to the Bar screen' },
                  { value: 'counter', label: 'Counter', hint: 'collected at the till' },
                ]}
              />
            )}
          />
          <FieldError message={errors.station?.message} />
        </div>

        <fieldset className="flex flex-col gap-4 rounded-xl border border-steam-200 bg-white p-4">
          <legend className="px-1 text-xl font-semibold">Milk</legend>
          <label className="flex min-h-11 items-center gap-3 text-lg font-semibold">
            <input type="checkbox" className="size-6 accent-copper-700" {...form.register('takesMilk')} />
            Takes milk (steamed, or cold for iced drinks)
          </label>
          {takesMilk && (
            <>
              <div className="max-w-sm">
                <label htmlFor="item-milk" className={label}>
                  Comes with
                </label>
                <select id="item-milk" className={inputClass} {...form.register('defaultMilkId')}>
                  <option value="">Choose a milk…</option>
                  {milks.map((m) => (
                    <option key={m.id} value={String(m.id)}>
                      {m.name} ({m.code})
                    </option>
                  ))}
                </select>
                <FieldError message={errors.defaultMilkId?.message} />
              </div>
              <div>
                <Controller
                  control={form.control}
                  name="texture"
                  render={({ field }) => (
                    <Segmented
                      label="Texture"
                      value={field.value || undefined}
                      onChange={field.onChange}
                      options={TEXTURES.map((t) => ({ value: t, label: t, hint: TEXTURE_HINT[t].split(' — ')[1] }))}
                    />
                  )}
                />
                <p className="mt-1 text-sm text-ink-600">The Bar steams a shared jug for its foamiest drink and pours the thinnest first.</p>
                <p className="mt-2 text-base">
                  <strong>⚠ Hot milk.</strong> {hotMilkNote(unit)}
                </p>
                <FieldError message={errors.texture?.message} />
              </div>
            </>
          )}
        </fieldset>

        <SizeRows form={form} takesMilk={takesMilk} retired={item?.sizes.filter((s) => s.retired) ?? []} sign={sign} />
        {!hasSizes && (
          <Field
            className="max-w-xs"
            label="Price"
            prefix={sign}
            inputMode="decimal"
            hint="For an item sold in one size only"
            error={errors.price?.message}
            {...form.register('price')}
            id="item-price"
          />
        )}

        <Controller
          control={form.control}
          name="ingredients"
          render={({ field }) => (
            <IngredientPicker
              list={menu.location.allergenList}
              value={field.value}
              onChange={field.onChange}
              hint="What the item itself contains; its milk and extras add their own."
              error={errors.ingredients?.message}
            />
          )}
        />
        <Controller
          control={form.control}
          name="extraGroupIds"
          render={({ field }) => (
            <CheckGroup
              legend="Extras offered"
              choices={groups.map((g) => ({ value: g.id, label: `${g.name}${g.retired ? ' (retired)' : ''}` }))}
              value={field.value}
              onChange={field.onChange}
              error={errors.extraGroupIds?.message}
            />
          )}
        />
      </form>
      {confirmRetire && item && (
        <ConfirmRetire
          what={item.name}
          consequence={`${item.name} leaves the Counter at once, on every screen.`}
          busy={command.isPending}
          onCancel={() => setConfirmRetire(false)}
          onConfirm={retire}
        />
      )}
    </Sheet>
  );
}
