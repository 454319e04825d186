// Categories as tabs, as the Counter shows them, with the chosen one's own actions beside.
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { categoryForm, type CategoryBody } from '@/domain/menu-admin-schemas';
import type { AdminCategory, AdminMenuView } from '@/domain/menu-admin-view';
import { Button } from '@/components/ui/button';
import { cn } from '@/lib/cn';
import type { MenuCommand } from './commands';
import { ConfirmRetire } from './dialog';
import { Field } from './fields';
import { MoveButtons } from './move-buttons';
import { showServerErrors } from './server-errors';

interface Props {
  menu: AdminMenuView;
  selected: AdminCategory | undefined;
  showRetired: boolean;
  command: MenuCommand;
  onSelect(id: number): void;
  notify(message: string, tone?: 'ok' | 'problem'): void;
}

function NameForm({
  initial,
  submitLabel,
  onSave,
  onCancel,
}: {
  initial: string;
  submitLabel: string;
  onSave(body: CategoryBody): Promise<void>;
  onCancel(): void;
}) {
  const form = useForm<CategoryBody>({ resolver: zodResolver(categoryForm), defaultValues: { name: initial } });
  const [problem, setProblem] = useState<string | null>(null);
  const save = form.handleSubmit(async (body) => {
    try {
      await onSave(body);
    } catch (err) {
      setProblem(showServerErrors(err, form.setError, ['name']));
    }
  });
  return (
    <form onSubmit={save} className="flex flex-wrap items-start gap-3" aria-label={submitLabel}>
      <Field
        label="Category name"
        autoFocus
        error={form.formState.errors.name?.message ?? problem ?? undefined}
        {...form.register('name')}
        id="category-name"
        className="w-72"
      />
      <Button type="submit" className="mt-6">
        {submitLabel}
      </Button>
      <Button tone="quiet" className="mt-6" onClick={onCancel}>
        Cancel
      </Button>
    </form>
  );
}

export function CategoryBar({ menu, selected, showRetired, command, onSelect, notify }: Props) {
  const [editing, setEditing] = useState<'new' | 'rename' | null>(null);
  const [confirm, setConfirm] = useState(false);
  const live = menu.categories.filter((c) => !c.retired);
  const shown = showRetired ? menu.categories : live;
  const at = selected ? live.findIndex((c) => c.id === selected.id) : -1;
  const run = async (work: Parameters<MenuCommand['mutateAsync']>[0], done: string) => {
    try {
      await command.mutateAsync(work);
      notify(done);
    } catch (err) {
      notify(err instanceof Error ? err.message : String(err), 'problem');
    }
  };

  return (
    <div className="flex flex-col gap-3">
      {/* a tablist holds only tabs (axe aria-required-children): the new-category button sits beside it */}
      <div className="flex flex-wrap gap-2 border-b border-steam-200">
        <div role="tablist" aria-label="Menu categories" className="flex flex-wrap gap-2">
          {shown.map((c) => (
            <button
              key={c.id}
              role="tab"
              type="button"
              aria-selected={c.id === selected?.id}
              onClick={() => onSelect(c.id)}
              className={cn(
                'min-h-14 rounded-t-lg border-b-4 px-5 text-xl font-semibold',
                c.id === selected?.id ? 'border-copper-700 bg-white' : 'border-transparent text-ink-600',
                c.retired && 'italic',
              )}
            >
              {c.name}
              {c.retired && <span className="ml-1 text-base font-medium">(retired)</span>}
            </button>
          ))}
        </div>
        <Button tone="quiet" className="mb-1 ml-2 self-center" onClick={() => setEditing('new')}>
          + New category
        </Button>
      </div>
      {editing === 'new' && (
        <NameForm
          initial=""
          submitLabel="Add category"
          onCancel={() => setEditing(null)}
          onSave={async (body) => {
            const r = await command.mutateAsync((c) => c.createCategory(body));
            setEditing(null);
            onSelect((r as { id: number }).id);
            notify(`Added the category ${body.name}.`);
          }}
        />
      )}
      {editing === 'rename' && selected && (
        <NameForm
          initial={selected.name}
          submitLabel="Rename"
          onCancel={() => setEditing(null)}
          onSave={async (body) => {
            await command.mutateAsync((c) => c.updateCategory({ id: selected.id, ...body }));
            setEditing(null);
            notify(`Renamed to ${body.name}.`);
          }}
        />
      )}
      {selected && editing === null && (
        <div className="flex flex-wrap items-center gap-3 text-base">
          <span className="text-ink-600">Category {selected.name}:</span>
          <Button tone="quiet" onClick={() => setEditing('rename')}>
            Rename
          </Button>
          {selected.retired ? (
            <Button
              tone="quiet"
              disabled={command.isPending}
              onClick={() => run((c) => c.setCategoryRetired({ id: selected.id, retired: false }), `Restored ${selected.name}.`)}
            >
              Restore category
            </Button>
          ) : (
            <>
              <MoveButtons
                across
                name={selected.name}
                first={at === 0}
                last={at === live.length - 1}
                busy={command.isPending}
                onMove={(d) => run((c) => c.moveCategory({ id: selected.id, direction: d }), `Moved ${selected.name}.`)}
              />
              <Button tone="quiet" onClick={() => setConfirm(true)}>
                Retire category…
              </Button>
            </>
          )}
        </div>
      )}
      {confirm && selected && (
        <ConfirmRetire
          what={selected.name}
          consequence="The tab leaves the Counter. A category can only go once its items are retired or moved."
          busy={command.isPending}
          onCancel={() => setConfirm(false)}
          onConfirm={async () => {
            setConfirm(false);
            await run((c) => c.setCategoryRetired({ id: selected.id, retired: true }), `Retired ${selected.name}.`);
          }}
        />
      )}
    </div>
  );
}
