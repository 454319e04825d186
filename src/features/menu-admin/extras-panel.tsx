// Groups of extras (pick one or any, required or not, on which items) and the extras in them.
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { extraForm, extraGroupForm, type ExtraFormValues, type ExtraGroupBody, type ExtraGroupFormValues } from '@/domain/menu-admin-schemas';
import type { Ingredient } from '@/domain/ingredients';
import { BAR_EFFECT_LABEL, BAR_EFFECT_NAME, BAR_EFFECTS, type BarEffect } from '@/domain/drink-options';
import type { AdminMenuView, AdminExtra, AdminExtraGroup } from '@/domain/menu-admin-view';
import { centsToAmountText } from '@/domain/menu-units';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { Segmented } from '@/components/ui/segmented';
import type { MenuCommand } from './commands';
import { ConfirmRetire, Sheet } from './dialog';
import { CheckGroup, Field, IngredientPicker, labelClass } from './fields';
import { currencySign, moneyOf } from './format';
import { MoveButtons } from './move-buttons';
import { showServerErrors } from './server-errors';
import { StatusBadge } from './status';

type Notify = (message: string, tone?: 'ok' | 'problem') => void;
type Work = Parameters<MenuCommand['mutateAsync']>[0];

function SaveFooter({ problem, label, busy, onSave }: { problem: string | null; label: string; busy: boolean; onSave(): void }) {
  return (
    <div className="flex items-center justify-end gap-3">
      {problem && (
        <p role="alert" className="text-base font-semibold text-copper-700">
          ⚠ {problem}
        </p>
      )}
      <Button size="lg" disabled={busy} onClick={onSave}>
        {label}
      </Button>
    </div>
  );
}

function GroupForm({
  menu,
  group,
  command,
  notify,
  onClose,
}: {
  menu: AdminMenuView;
  group: AdminExtraGroup | null;
  command: MenuCommand;
  notify: Notify;
  onClose(): void;
}) {
  const form = useForm<ExtraGroupFormValues, unknown, ExtraGroupBody>({
    resolver: zodResolver(extraGroupForm),
    defaultValues: group
      ? { name: group.name, selection: group.selection, required: group.required, itemIds: group.itemIds }
      : { name: '', selection: 'multi', required: false, itemIds: [] },
  });
  const [problem, setProblem] = useState<string | null>(null);
  const errors = form.formState.errors;
  const live = menu.items.filter((i) => !i.retired);
  const save = form.handleSubmit(async (body) => {
    try {
      await command.mutateAsync((c) => (group ? c.updateExtraGroup({ id: group.id, ...body }) : c.createExtraGroup(body)));
      notify(`${group ? 'Saved' : 'Added'} the group ${body.name}.`);
      onClose();
    } catch (err) {
      setProblem(showServerErrors(err, form.setError, ['name', 'selection', 'required', 'itemIds']));
    }
  });
  return (
    <Sheet
      title={group ? `Edit ${group.name}` : 'New group of extras'}
      onClose={onClose}
      footer={<SaveFooter problem={problem} label={group ? 'Save group' : 'Add group'} busy={command.isPending} onSave={save} />}
    >
      <form onSubmit={save} noValidate className="flex flex-col gap-5" aria-label="Group of extras">
        <Field label="Name" placeholder="Syrup" error={errors.name?.message} {...form.register('name')} id="group-name" />
        <Controller
          control={form.control}
          name="selection"
          render={({ field }) => (
            <Segmented
              label="Choices"
              value={field.value}
              onChange={field.onChange}
              options={[
                { value: 'single', label: 'Pick one', hint: 'e.g. a temperature' },
                { value: 'multi', label: 'Pick any', hint: 'e.g. syrups' },
              ]}
            />
          )}
        />
        <label className="flex min-h-11 items-center gap-3 text-lg font-semibold">
          <input type="checkbox" className="size-6 accent-copper-700" {...form.register('required')} />
          Required: the cashier must choose one before adding the drink
        </label>
        <Controller
          control={form.control}
          name="itemIds"
          render={({ field }) => (
            <CheckGroup
              legend="Offered on"
              choices={live.map((i) => ({ value: i.id, label: i.name }))}
              value={field.value}
              onChange={(next) => field.onChange([...next, ...field.value.filter((id) => !live.some((i) => i.id === id))])}
              error={errors.itemIds?.message}
            />
          )}
        />
        <FieldError message={errors.root?.message} />
      </form>
    </Sheet>
  );
}

function ExtraForm({
  menu,
  groupId,
  extra,
  command,
  notify,
  onClose,
}: {
  menu: AdminMenuView;
  groupId: number;
  extra: AdminExtra | null;
  command: MenuCommand;
  notify: Notify;
  onClose(): void;
}) {
  const form = useForm<ExtraFormValues, unknown, { name: string; priceCents: number; ingredients: Ingredient[]; barEffect: BarEffect | null }>({
    resolver: zodResolver(extraForm),
    defaultValues: extra
      ? { name: extra.name, price: centsToAmountText(extra.priceCents), ingredients: extra.ingredients, barEffect: extra.barEffect ?? '' }
      : { name: '', price: '0.00', ingredients: [], barEffect: '' },
  });
  const [problem, setProblem] = useState<string | null>(null);
  const errors = form.formState.errors;
  const save = form.handleSubmit(async (f) => {
    const body = { ...f, groupId };
    try {
      await command.mutateAsync((c) => (extra ? c.updateExtra({ id: extra.id, ...body }) : c.createExtra(body)));
      notify(`${extra ? 'Saved' : 'Added'} ${body.name}.`);
      onClose();
    } catch (err) {
      setProblem(showServerErrors(err, form.setError, ['name', 'price', 'ingredients', 'barEffect']));
    }
  });
  return (
    <Sheet
      title={extra ? `Edit ${extra.name}` : 'New extra'}
      onClose={onClose}
      footer={<SaveFooter problem={problem} label={extra ? 'Save extra' : 'Add extra'} busy={command.isPending} onSave={save} />}
    >
      <form onSubmit={save} noValidate className="flex flex-col gap-5" aria-label="Extra">
        <Field label="Name" placeholder="Vanilla syrup" error={errors.name?.message} {...form.register('name')} id="extra-name" />
        <Field
          label="Price"
          prefix={currencySign(menu)}
          className="max-w-xs"
          inputMode="decimal"
          hint="0.00 for a free choice"
          error={errors.price?.message}
          {...form.register('price')}
          id="extra-price"
        />
        <div>
          <label className={labelClass} htmlFor="extra-bar-effect">
            At the bar
          </label>
          <select
            id="extra-bar-effect"
            aria-describedby="extra-bar-effect-hint"
            {...form.register('barEffect')}
            className="min-h-11 w-full max-w-md rounded-lg border border-steam-200 bg-white px-3 text-base"
          >
            <option value="">Nothing more: named on the Bar card</option>
            {BAR_EFFECTS.map((e) => (
              <option key={e} value={e}>
                {BAR_EFFECT_LABEL[e]}
              </option>
            ))}
          </select>
          <p id="extra-bar-effect-hint" className="mt-1 text-sm text-ink-600">
            Changes the drink's milk and jug as the Bar makes it; the price stays as set above.
          </p>
        </div>
        <Controller
          control={form.control}
          name="ingredients"
          render={({ field }) => (
            <IngredientPicker
              list={menu.location.allergenList}
              value={field.value}
              onChange={field.onChange}
              hint="What the extra adds: almond for an almond syrup that contains nut."
              error={errors.ingredients?.message}
            />
          )}
        />
      </form>
    </Sheet>
  );
}

type Editing = { kind: 'group'; group: AdminExtraGroup | null } | { kind: 'extra'; groupId: number; extra: AdminExtra | null } | null;
type Retiring = { kind: 'extra-groups' | 'extras'; id: number; name: string } | null;

export function ExtrasPanel({ menu, command, notify }: { menu: AdminMenuView; command: MenuCommand; notify: Notify }) {
  const [editing, setEditing] = useState<Editing>(null);
  const [retiring, setRetiring] = useState<Retiring>(null);
  const money = moneyOf(menu);
  const liveGroups = menu.extraGroups.filter((g) => !g.retired);
  const run = async (work: Work, done: string) => {
    try {
      await command.mutateAsync(work);
      notify(done);
    } catch (err) {
      notify(err instanceof Error ? err.message : String(err), 'problem');
    }
  };
  const itemNames = (ids: number[]) => menu.items.filter((i) => ids.includes(i.id) && !i.retired).map((i) => i.name);

  return (
    <section aria-labelledby="extras-heading" className="flex flex-col gap-4">
      <div className="flex items-center gap-4">
        <h2 id="extras-heading" className="text-2xl font-semibold">
          Extras
        </h2>
        <p className="text-base text-ink-600">Groups of extras show on an item's sheet at the Counter, in this order.</p>
        <Button className="ml-auto" onClick={() => setEditing({ kind: 'group', group: null })}>
          + New group
        </Button>
      </div>
      {menu.extraGroups.map((g) => {
        const at = liveGroups.findIndex((x) => x.id === g.id);
        const mods = menu.extras.filter((m) => m.groupId === g.id);
        const liveMods = mods.filter((m) => !m.retired);
        const on = itemNames(g.itemIds);
        return (
          <article
            key={g.id}
            data-testid="extra-group"
            aria-label={`Group ${g.name}`}
            className={`rounded-xl border border-steam-200 p-5 ${g.retired ? 'bg-steam-100' : 'bg-white'}`}
          >
            <header className="flex flex-wrap items-center gap-3">
              {!g.retired && (
                <MoveButtons
                  name={g.name}
                  first={at === 0}
                  last={at === liveGroups.length - 1}
                  busy={command.isPending}
                  onMove={(d) => run((c) => c.moveExtraGroup({ id: g.id, direction: d }), `Moved ${g.name}.`)}
                />
              )}
              <h3 className="text-xl font-semibold">{g.name}</h3>
              <span className="text-lg">
                {/* with one extra in the group there is nothing to pick between */}
                {liveMods.length === 1 ? 'One extra' : g.selection === 'single' ? 'Pick one' : 'Pick any'} · {g.required ? 'Required' : 'Optional'}
              </span>
              <StatusBadge status={g.retired ? 'retired' : 'in-use'} />
              <span className="ml-auto inline-flex gap-2">
                {g.retired ? (
                  <Button
                    tone="quiet"
                    disabled={command.isPending}
                    onClick={() => run((c) => c.setExtraGroupRetired({ id: g.id, retired: false }), `Restored ${g.name}.`)}
                  >
                    Restore group
                  </Button>
                ) : (
                  <Button tone="quiet" onClick={() => setRetiring({ kind: 'extra-groups', id: g.id, name: g.name })}>
                    Retire group…
                  </Button>
                )}
                <Button tone="quiet" onClick={() => setEditing({ kind: 'group', group: g })} aria-label={`Edit group ${g.name}`}>
                  Edit group
                </Button>
              </span>
            </header>
            <p className="mt-1 text-base text-ink-600">{on.length ? `On ${on.join(', ')}` : 'Not offered on any item yet'}</p>
            <ul className="mt-3 flex flex-col">
              {mods.map((m) => {
                const mAt = liveMods.findIndex((x) => x.id === m.id);
                return (
                  <li key={m.id} className={`flex flex-wrap items-center gap-3 border-t border-steam-200 py-2 ${m.retired ? 'text-ink-600' : ''}`}>
                    {!m.retired ? (
                      <MoveButtons
                        name={m.name}
                        first={mAt === 0}
                        last={mAt === liveMods.length - 1}
                        busy={command.isPending}
                        onMove={(d) => run((c) => c.moveExtra({ id: m.id, direction: d }), `Moved ${m.name}.`)}
                      />
                    ) : (
                      <span className="w-[5.75rem]" />
                    )}
                    <span className="min-w-48 text-lg font-semibold">{m.name}</span>
                    <span className="w-24 text-lg tabular-nums">{m.priceCents ? `+${money(m.priceCents)}` : 'free'}</span>
                    {m.barEffect && (
                      // in words: the extra changes how the Bar makes the drink
                      <span data-testid="extra-bar-effect" className="rounded-full border border-ink-600 px-2.5 py-0.5 text-sm font-semibold whitespace-nowrap">
                        At the bar: {BAR_EFFECT_NAME[m.barEffect]}
                      </span>
                    )}
                    <span className="text-base">{m.allergens.length ? `⚠ ${m.allergens.join(', ')}` : ''}</span>
                    {m.retired && <StatusBadge status="retired" />}
                    <span className="ml-auto inline-flex gap-2">
                      {m.retired ? (
                        <Button
                          tone="quiet"
                          disabled={command.isPending}
                          onClick={() => run((c) => c.setExtraRetired({ id: m.id, retired: false }), `Restored ${m.name}.`)}
                          aria-label={`Restore ${m.name}`}
                        >
                          Restore
                        </Button>
                      ) : (
                        <Button tone="quiet" onClick={() => setRetiring({ kind: 'extras', id: m.id, name: m.name })} aria-label={`Retire ${m.name}`}>
                          Retire…
                        </Button>
                      )}
                      <Button tone="quiet" onClick={() => setEditing({ kind: 'extra', groupId: g.id, extra: m })} aria-label={`Edit ${m.name}`}>
                        Edit
                      </Button>
                    </span>
                  </li>
                );
              })}
            </ul>
            {!g.retired && (
              <Button tone="quiet" className="mt-2" onClick={() => setEditing({ kind: 'extra', groupId: g.id, extra: null })}>
                + Add an extra to {g.name}
              </Button>
            )}
          </article>
        );
      })}
      {editing?.kind === 'group' && <GroupForm menu={menu} group={editing.group} command={command} notify={notify} onClose={() => setEditing(null)} />}
      {editing?.kind === 'extra' && (
        <ExtraForm menu={menu} groupId={editing.groupId} extra={editing.extra} command={command} notify={notify} onClose={() => setEditing(null)} />
      )}
      {retiring && (
        <ConfirmRetire
          what={retiring.name}
          consequence={
            retiring.kind === 'extras' ? 'The Counter stops offering this extra.' : 'The group and its extras leave every item’s sheet at the Counter.'
          }
          busy={command.isPending}
          onCancel={() => setRetiring(null)}
          onConfirm={async () => {
            const r = retiring;
            setRetiring(null);
            await run((c) => (r.kind === 'extras' ? c.setExtraRetired : c.setExtraGroupRetired)({ id: r.id, retired: true }), `Retired ${r.name}.`);
          }}
        />
      )}
    </section>
  );
}
