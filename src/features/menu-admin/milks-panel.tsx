// Milks: each is a lane on the Bar, headed by its two-letter code. Name, code, upcharge, and what
// it is made of (the allergens follow for the café's list).
import { ScrollBox } from '@/components/ui/scroll-box';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { milkForm, type MilkBody, type MilkFormValues } from '@/domain/menu-admin-schemas';
import type { AdminMenuView, AdminMilk } from '@/domain/menu-admin-view';
import { centsToAmountText } from '@/domain/menu-units';
import { Button } from '@/components/ui/button';
import type { MenuCommand } from './commands';
import { ConfirmRetire, Sheet } from './dialog';
import { Field, IngredientPicker } from './fields';
import { currencySign, moneyOf } from './format';
import { MoveButtons } from './move-buttons';
import { showServerErrors } from './server-errors';
import { StatusBadge } from './status';

type Notify = (message: string, tone?: 'ok' | 'problem') => void;

function MilkForm({
  menu,
  milk,
  command,
  notify,
  onClose,
}: {
  menu: AdminMenuView;
  milk: AdminMilk | null;
  command: MenuCommand;
  notify: Notify;
  onClose(): void;
}) {
  const form = useForm<MilkFormValues, unknown, MilkBody>({
    resolver: zodResolver(milkForm),
    defaultValues: milk
      ? { name: milk.name, code: milk.code, upcharge: centsToAmountText(milk.upchargeCents), ingredients: milk.ingredients }
      : { name: '', code: '', upcharge: '0.00', ingredients: [] },
  });
  const [problem, setProblem] = useState<string | null>(null);
  const errors = form.formState.errors;
  const save = form.handleSubmit(async (body) => {
    try {
      await command.mutateAsync((c) => (milk ? c.updateMilk({ id: milk.id, ...body }) : c.createMilk(body)));
      notify(`${milk ? 'Saved' : 'Added'} ${body.name} (${body.code}).`);
      onClose();
    } catch (err) {
      setProblem(showServerErrors(err, form.setError, ['name', 'code', 'upcharge', 'ingredients']));
    }
  });
  return (
    <Sheet
      title={milk ? `Edit ${milk.name}` : 'New milk'}
      onClose={onClose}
      footer={
        <div className="flex items-center justify-end gap-3">
          {problem && (
            <p role="alert" className="text-base font-semibold text-copper-700">
              ⚠ {problem}
            </p>
          )}
          <Button size="lg" disabled={command.isPending} onClick={save}>
            {milk ? 'Save milk' : 'Add milk'}
          </Button>
        </div>
      }
    >
      <form onSubmit={save} noValidate className="flex flex-col gap-5" aria-label="Milk">
        <Field label="Name" error={errors.name?.message} {...form.register('name')} id="milk-name" />
        <Field
          label="Lane code"
          className="max-w-xs"
          maxLength={2}
          hint="Two letters on the Bar's lane header and the cup label, unique in the café"
          error={errors.code?.message}
          {...form.register('code')}
          id="milk-code"
        />
        <Field
          label="Upcharge"
          prefix={currencySign(menu)}
          className="max-w-xs"
          inputMode="decimal"
          hint="Added to the drink's price; 0.00 for none"
          error={errors.upcharge?.message}
          {...form.register('upcharge')}
          id="milk-upcharge"
        />
        <Controller
          control={form.control}
          name="ingredients"
          render={({ field }) => (
            <IngredientPicker
              list={menu.location.allergenList}
              value={field.value}
              onChange={field.onChange}
              hint="What the milk is made of: oats for an oat milk, cow's milk for whole."
              error={errors.ingredients?.message}
            />
          )}
        />
      </form>
    </Sheet>
  );
}

export function MilksPanel({ menu, command, notify }: { menu: AdminMenuView; command: MenuCommand; notify: Notify }) {
  const [editing, setEditing] = useState<AdminMilk | 'new' | null>(null);
  const [retiring, setRetiring] = useState<AdminMilk | null>(null);
  const money = moneyOf(menu);
  const live = menu.milks.filter((m) => !m.retired);
  const run = async (work: Parameters<MenuCommand['mutateAsync']>[0], done: string) => {
    try {
      await command.mutateAsync(work);
      notify(done);
    } catch (err) {
      notify(err instanceof Error ? err.message : String(err), 'problem');
    }
  };
  const th = 'border-b-2 border-steam-200 px-2 py-2 text-left text-sm font-semibold tracking-wide text-ink-600 uppercase';
  const td = 'border-b border-steam-200 px-2 py-3 align-middle';
  return (
    <section aria-labelledby="milks-heading" className="rounded-xl border border-steam-200 bg-white p-5">
      <div className="mb-3 flex items-center gap-4">
        <h2 id="milks-heading" className="text-2xl font-semibold">
          Milks
        </h2>
        <p className="text-base text-ink-600">Each milk is a lane on the Bar. Drinks that take milk offer every milk in use.</p>
        <Button className="ml-auto" onClick={() => setEditing('new')}>
          + New milk
        </Button>
      </div>
      <ScrollBox label="Milks table">
        <table className="w-full border-collapse text-lg">
          <thead>
            <tr>
              <th className={th}>Order</th>
              <th className={th}>Milk</th>
              <th className={th}>Code</th>
              <th className={th}>Upcharge</th>
              <th className={th}>Made of</th>
              <th className={th}>Allergens ({menu.location.allergenList} list)</th>
              <th className={th}>Status</th>
              <th className={th}>
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {menu.milks.map((m) => {
              const at = live.findIndex((x) => x.id === m.id);
              return (
                <tr key={m.id} data-testid="milk-row" className={m.retired ? 'bg-steam-100 text-ink-600' : undefined}>
                  <td className={td}>
                    {!m.retired && (
                      <MoveButtons
                        name={m.name}
                        first={at === 0}
                        last={at === live.length - 1}
                        busy={command.isPending}
                        onMove={(d) => run((c) => c.moveMilk({ id: m.id, direction: d }), `Moved ${m.name}.`)}
                      />
                    )}
                  </td>
                  <td className={`${td} text-xl font-semibold`}>{m.name}</td>
                  <td className={td}>
                    <span className="inline-grid size-11 place-items-center rounded-lg border-2 border-ink-900 font-display text-xl font-semibold">
                      {m.code}
                    </span>
                  </td>
                  <td className={`${td} tabular-nums`}>{m.upchargeCents ? `+${money(m.upchargeCents)}` : 'none'}</td>
                  <td className={td}>{m.ingredients.length ? m.ingredients.join(', ') : <strong>⚠ not recorded: say what it is made of</strong>}</td>
                  <td className={td}>{m.allergens.length ? m.allergens.join(', ') : <span className="text-ink-600">none on the list</span>}</td>
                  <td className={td}>
                    <StatusBadge status={m.retired ? 'retired' : 'in-use'} />
                  </td>
                  <td className={`${td} text-right`}>
                    <span className="inline-flex gap-2">
                      {m.retired ? (
                        <Button
                          tone="quiet"
                          disabled={command.isPending}
                          onClick={() => run((c) => c.setMilkRetired({ id: m.id, retired: false }), `Restored ${m.name}.`)}
                          aria-label={`Restore ${m.name}`}
                        >
                          Restore
                        </Button>
                      ) : (
                        <Button tone="quiet" onClick={() => setRetiring(m)} aria-label={`Retire ${m.name}`}>
                          Retire…
                        </Button>
                      )}
                      <Button tone="quiet" onClick={() => setEditing(m)} aria-label={`Edit ${m.name}`}>
                        Edit
                      </Button>
                    </span>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </ScrollBox>
      {editing && <MilkForm menu={menu} milk={editing === 'new' ? null : editing} command={command} notify={notify} onClose={() => setEditing(null)} />}
      {retiring && (
        <ConfirmRetire
          what={retiring.name}
          consequence={`The Counter stops offering ${retiring.name} and its lane leaves the Bar once its drinks are made. A milk that drinks come with can't go until they come with another.`}
          busy={command.isPending}
          onCancel={() => setRetiring(null)}
          onConfirm={async () => {
            const m = retiring;
            setRetiring(null);
            await run((c) => c.setMilkRetired({ id: m.id, retired: true }), `Retired ${m.name}.`);
          }}
        />
      )}
    </section>
  );
}
