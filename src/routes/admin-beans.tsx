// Beans (back office, owner): the lots with their age, freshness, stock and run-out estimate; add,
// edit, move between grinders, retire; and the location's dial-in window. Light theme.
import { useMutation, useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import { useCallback, useState } from 'react';
import type { LoaderFunctionArgs } from 'react-router';
import type { BeanLotView } from '@/domain/bean-stock';
import { SCREENS } from '@/domain/screens';
import { Button } from '@/components/ui/button';
import { StaffMenu } from '@/features/team/staff-menu';
import { dateText } from '@/features/beans/format';
import { LotForm } from '@/features/beans/lot-form';
import { LotsTable } from '@/features/beans/lots-table';
import { beanKeys, beansQuery } from '@/queries/beans';
import { BeanSettingsForm } from '@/features/beans/settings-form';
import { useApi } from '@/lib/api-context';
import { send } from '@/lib/commands';
import { ApiError } from '@/lib/http';
import { requireScreen, type RouteDeps } from './deps';

function RetireConfirm({ lot, onDone }: { lot: BeanLotView; onDone(): void }) {
  const qc = useQueryClient();
  const retire = useMutation({
    mutationFn: () => send.retireLot({ id: lot.id }),
    onSuccess: async () => {
      await qc.invalidateQueries({ queryKey: beanKeys.all });
      onDone();
    },
  });
  const left = Math.max(0, Math.round(lot.remainingDg / 10));
  return (
    <div role="group" aria-label={`Retire ${lot.name}`} className="flex flex-wrap items-center gap-3 rounded-xl border-2 border-ink-900 bg-white px-4 py-3">
      <p className="text-lg">
        Retire <strong>{lot.name}</strong>? It leaves the grinders and the list{left > 0 ? ` — the count says ${left} g are still in the bag` : ''}.
      </p>
      <Button size="lg" disabled={retire.isPending} onClick={() => retire.mutate()}>
        Yes, retire it
      </Button>
      <Button tone="quiet" size="lg" onClick={onDone}>
        Keep it
      </Button>
      {retire.error && (
        <p role="alert" className="font-semibold text-copper-700">
          {retire.error instanceof ApiError ? retire.error.message : 'That did not work'}
        </p>
      )}
    </div>
  );
}

function AdminBeans() {
  const api = useApi();
  const { data: v } = useSuspenseQuery(beansQuery(api));
  const [editing, setEditing] = useState<BeanLotView | 'new' | null>(null);
  const [retiring, setRetiring] = useState<BeanLotView | null>(null);
  const [showRetired, setShowRetired] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const onEdit = useCallback((l: BeanLotView) => {
    setRetiring(null);
    setEditing(l);
  }, []);
  const onRetire = useCallback((l: BeanLotView) => {
    setEditing(null);
    setRetiring(l);
  }, []);
  const onAdd = () => {
    setRetiring(null);
    setEditing('new');
  };
  const retiredCount = v.lots.filter((l) => l.retiredAt).length;

  return (
    <div className="min-h-screen bg-steam-50 text-ink-900">
      <header className="flex flex-wrap items-center gap-x-6 gap-y-2 border-b border-steam-200 px-5 py-3">
        <h1 className="text-3xl font-semibold">Beans</h1>
        <p className="text-lg text-ink-600">
          Today {dateText(v.today, v.locale)} · days since roast counted in café days ({v.timeZone})
        </p>
        <div className="ml-auto">
          <StaffMenu />
        </div>
      </header>
      <main className="flex flex-col gap-5 p-5">
        <section aria-labelledby="lots-heading" className="rounded-2xl border border-steam-200 bg-white p-4">
          <div className="mb-2 flex flex-wrap items-center gap-4">
            <h2 id="lots-heading" className="mr-auto text-2xl font-semibold">
              Lots
            </h2>
            {retiredCount > 0 && (
              <label className="flex min-h-11 items-center gap-2 text-lg">
                <input type="checkbox" className="size-5" checked={showRetired} onChange={(e) => setShowRetired(e.target.checked)} />
                Show retired ({retiredCount})
              </label>
            )}
            <Button size="lg" onClick={onAdd}>
              Add a lot
            </Button>
          </div>
          <LotsTable lots={v.lots} showRetired={showRetired} timeZone={v.timeZone} locale={v.locale} onEdit={onEdit} onRetire={onRetire} />
        </section>
        <p role="status" className={notice ? 'rounded-xl border-2 border-ink-900 bg-white px-4 py-3 text-lg' : 'sr-only'}>
          {notice && `✓ ${notice}`}
        </p>
        {retiring && <RetireConfirm key={retiring.id} lot={retiring} onDone={() => setRetiring(null)} />}
        {editing && (
          <LotForm
            key={editing === 'new' ? 'new' : editing.id}
            lot={editing === 'new' ? null : editing}
            lots={v.lots}
            today={v.today}
            onDone={(said) => {
              setEditing(null);
              setNotice(said ?? null);
            }}
          />
        )}
        <BeanSettingsForm settings={v.settings} />
      </main>
    </div>
  );
}

export const adminBeansRoute = (deps: RouteDeps) => ({
  Component: AdminBeans,
  handle: { title: 'Beans' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.adminBeans.need);
    await deps.queryClient.ensureQueryData(beansQuery(deps.api));
    return null;
  },
});
