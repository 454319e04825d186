// Menu (back office, owner): categories, items with their sizes and recipes, milks and extras.
// Every save reaches open Counters and Bars at once through the menu.changed event.
import { useSuspenseQuery } from '@tanstack/react-query';
import { useCallback, useMemo, useState } from 'react';
import type { LoaderFunctionArgs } from 'react-router';
import type { AdminItem } from '@/domain/menu-admin-view';
import { SCREENS } from '@/domain/screens';
import { Button } from '@/components/ui/button';
import { ScrollBox } from '@/components/ui/scroll-box';
import { StaffMenu } from '@/features/team/staff-menu';
import { CategoryBar } from '@/features/menu-admin/category-bar';
import { useMenuCommand } from '@/features/menu-admin/commands';
import { ExtrasPanel } from '@/features/menu-admin/extras-panel';
import { ItemForm } from '@/features/menu-admin/item-form';
import { ItemsTable, type ItemActions } from '@/features/menu-admin/items-table';
import { MilksPanel } from '@/features/menu-admin/milks-panel';
import { menuAdminQuery } from '@/queries/menu-admin';
import { MenuImportPanel } from '@/features/menu-import/menu-import-panel';
import { useApi } from '@/lib/api-context';
import { cn } from '@/lib/cn';
import { requireScreen, type RouteDeps } from './deps';

type Part = 'items' | 'milks' | 'extras';
const PARTS: { id: Part; label: string }[] = [
  { id: 'items', label: 'Items' },
  { id: 'milks', label: 'Milks' },
  { id: 'extras', label: 'Extras' },
];

function AdminMenu() {
  const { data: menu } = useSuspenseQuery(menuAdminQuery(useApi()));
  const command = useMenuCommand();
  const [part, setPart] = useState<Part>('items');
  const [categoryId, setCategoryId] = useState<number | undefined>(menu.categories.find((c) => !c.retired)?.id);
  const [showRetired, setShowRetired] = useState(false);
  const [editing, setEditing] = useState<AdminItem | 'new' | null>(null);
  const [notice, setNotice] = useState<{ message: string; tone: 'ok' | 'problem' } | null>(null);
  const notify = useCallback((message: string, tone: 'ok' | 'problem' = 'ok') => setNotice({ message, tone }), []);

  const category = menu.categories.find((c) => c.id === categoryId) ?? menu.categories.find((c) => !c.retired);
  const items = menu.items.filter((i) => i.categoryId === category?.id && (showRetired || !i.retired));
  const retiredCount = menu.items.filter((i) => i.retired).length + menu.categories.filter((c) => c.retired).length;
  const run = useCallback(
    async (work: Parameters<typeof command.mutateAsync>[0], done: string) => {
      try {
        await command.mutateAsync(work);
        notify(done);
      } catch (err) {
        notify(err instanceof Error ? err.message : String(err), 'problem');
      }
    },
    [command, notify],
  );
  const actions = useMemo<ItemActions>(
    () => ({
      busy: command.isPending,
      edit: (i) => setEditing(i),
      move: (i, d) => run((c) => c.moveItem({ id: i.id, direction: d }), `Moved ${i.name}.`),
      setAvailable: (i, available) =>
        run((c) => c.setAvailability({ id: i.id, available }), available ? `${i.name} is back on.` : `${i.name} is 86'd: the Counter shows it unavailable.`),
      restore: (i) => run((c) => c.setItemRetired({ id: i.id, retired: false }), `Restored ${i.name}.`),
    }),
    [command.isPending, run],
  );

  return (
    <div className="min-h-screen bg-steam-50 text-ink-900">
      <header className="flex flex-wrap items-center gap-x-5 gap-y-2 border-b border-steam-200 px-4 py-4 lg:px-6">
        <h1 className="text-3xl font-semibold">Menu</h1>
        <span className="text-lg text-ink-600">{menu.location.name}</span>
        <div className="ml-auto">
          <StaffMenu />
        </div>
      </header>
      <main className="flex flex-col gap-4 px-4 py-5 lg:px-6">
        <div className="flex flex-wrap items-center gap-4">
          <div role="tablist" aria-label="Menu parts" className="flex gap-2">
            {PARTS.map((p) => (
              <button
                key={p.id}
                type="button"
                role="tab"
                aria-selected={part === p.id}
                onClick={() => setPart(p.id)}
                className={cn(
                  'min-h-12 rounded-lg border-2 px-5 text-lg font-semibold',
                  part === p.id ? 'border-ink-900 bg-ink-900 text-steam-50' : 'border-steam-200 bg-white text-ink-900',
                )}
              >
                {part === p.id && <span aria-hidden>✓ </span>}
                {p.label}
              </button>
            ))}
          </div>
          <p
            role="status"
            className={cn(
              'min-h-12 flex-1 rounded-xl border-2 px-4 py-2 text-lg',
              !notice && 'border-transparent',
              notice?.tone === 'ok' && 'border-ink-900 bg-white',
              notice?.tone === 'problem' && 'border-copper-700 bg-white font-semibold text-copper-700',
            )}
          >
            {notice && (notice.tone === 'problem' ? `⚠ ${notice.message}` : `✓ ${notice.message}`)}
          </p>
        </div>

        {part === 'items' && (
          <section aria-label="Items" className="rounded-xl border border-steam-200 bg-white p-4 lg:p-5">
            <CategoryBar menu={menu} selected={category} showRetired={showRetired} command={command} onSelect={setCategoryId} notify={notify} />
            <div className="mt-4 mb-2 flex flex-wrap items-center gap-4">
              <Button disabled={!category || category.retired} onClick={() => setEditing('new')}>
                + New item{category ? ` in ${category.name}` : ''}
              </Button>
              <label className="flex min-h-11 items-center gap-2 text-lg">
                <input type="checkbox" className="size-5 accent-copper-700" checked={showRetired} onChange={(e) => setShowRetired(e.target.checked)} />
                Show retired ({retiredCount})
              </label>
            </div>
            <ScrollBox label="Items table">
              <ItemsTable menu={menu} items={items} actions={actions} />
            </ScrollBox>
          </section>
        )}
        {part === 'milks' && <MilksPanel menu={menu} command={command} notify={notify} />}
        {part === 'extras' && <ExtrasPanel menu={menu} command={command} notify={notify} />}
        <MenuImportPanel />
      </main>
      {editing && category && (
        <ItemForm
          menu={menu}
          item={editing === 'new' ? null : editing}
          categoryId={category.id}
          command={command}
          notify={notify}
          onClose={() => setEditing(null)}
        />
      )}
    </div>
  );
}

export const adminMenuRoute = (deps: RouteDeps) => ({
  Component: AdminMenu,
  handle: { title: 'Menu' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.adminMenu.need);
    await deps.queryClient.ensureQueryData(menuAdminQuery(deps.api));
    return null;
  },
});
