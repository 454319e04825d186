// Dial-in (barista, lead, owner): log test shots for a lot — grind, dose, yield, time — and get the
// next change to make; the lot's last good settings go to the Bar. Touch-first, light theme.
import { useMutation, useQuery, useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { type ShotAdvice } from '@/domain/dial-in';
import { formatRatio } from '@/domain/format';
import { SCREENS } from '@/domain/screens';
import { StaffMenu } from '@/features/team/staff-menu';
import { AdvicePanel } from '@/features/dial-in/advice-panel';
import { LotPicker } from '@/features/dial-in/lot-picker';
import { dialInKeys, dialInQuery, lotShotsQuery } from '@/queries/dial-in';
import { ShotForm, type ShotFields } from '@/features/dial-in/shot-form';
import { ShotList } from '@/features/dial-in/shot-list';
import { goodShotWords, shotNumbers, timeOfDay } from '@/features/dial-in/shot-view';
import { keepUnits } from '@/lib/keep-units';
import { useApi } from '@/lib/api-context';
import type { DialInView } from '@/domain/beans-schemas';
import { send } from '@/lib/commands';
import { ApiError } from '@/lib/http';
import { requireScreen, type RouteDeps } from './deps';

/** The lot asked for in ?lot=, else the one in the espresso grinder, else the first. */
function chosenLot(v: DialInView, search: URLSearchParams): number | null {
  const asked = Number(search.get('lot'));
  if (v.lots.some((l) => l.id === asked)) return asked;
  return v.espressoLotId ?? v.lots[0]?.id ?? null;
}

function DialIn() {
  const api = useApi();
  const qc = useQueryClient();
  const [search, setSearch] = useSearchParams();
  const { data: v } = useSuspenseQuery(dialInQuery(api));
  const lotId = chosenLot(v, search);
  const lot = v.lots.find((l) => l.id === lotId) ?? null;
  const { data: shots } = useQuery({ ...lotShotsQuery(api, lotId ?? 0), enabled: lotId !== null });
  const [advice, setAdvice] = useState<{ lotId: number; advice: ShotAdvice } | null>(null);
  const log = useMutation({
    mutationFn: (f: ShotFields) => send.logShot({ ...f, lotId: lotId! }),
    onSuccess: async (r) => {
      setAdvice({ lotId: r.shot.lotId, advice: r.advice });
      await qc.invalidateQueries({ queryKey: dialInKeys.all });
    },
  });
  const w = v.window;
  const good = lot?.lastGood ?? null;
  const defaults: Partial<ShotFields> = {
    grind: good?.grind ?? '',
    doseG: (good?.doseDg ?? v.recipeDoseDg ?? 180) / 10,
    yieldG: good ? good.yieldDg / 10 : undefined,
  };

  return (
    <div className="min-h-screen bg-steam-50 text-ink-900">
      <header className="flex flex-wrap items-center gap-x-6 gap-y-2 border-b border-steam-200 px-5 py-3">
        <h1 className="text-3xl font-semibold">Dial-in</h1>
        <p className="text-lg" data-testid="window">
          {keepUnits(goodShotWords(w, v.recipeDoseDg))}
        </p>
        <div className="ml-auto">
          <StaffMenu />
        </div>
      </header>
      <main className="flex flex-col gap-4 p-5">
        {v.lots.length === 0 ? (
          <p className="text-2xl">No bean lots yet: the owner adds them on the Beans screen.</p>
        ) : (
          <LotPicker lots={v.lots} value={lotId} onChange={(id) => setSearch({ lot: String(id) }, { replace: true, preventScrollReset: true })} />
        )}
        {lot && (
          <>
            <ShotForm key={lot.id} defaults={defaults} busy={log.isPending} onLog={(f) => log.mutate(f)} />
            {log.error && (
              <p role="alert" className="text-lg font-semibold text-copper-700">
                {log.error instanceof ApiError ? log.error.message : 'That did not work'}
              </p>
            )}
            <div className="grid grid-cols-1 gap-4 md:grid-cols-2">
              <AdvicePanel advice={advice?.lotId === lot.id ? advice.advice : null} />
              <section aria-label="Last good settings" className="rounded-2xl border border-steam-200 bg-white p-5">
                <h2 className="text-sm font-semibold tracking-widest text-ink-600 uppercase">Last good settings · {lot.name}</h2>
                {good ? (
                  <div data-testid="last-good">
                    <p className="mt-1 font-display text-4xl font-semibold">Grind {good.grind}</p>
                    <p className="text-xl">{shotNumbers(good)}</p>
                    <p className="text-base text-ink-600">
                      {good.pulledBy}, {timeOfDay(good.pulledAt, v.timeZone, v.locale)}
                      {good.tasteNote && ` — “${good.tasteNote}”`}
                    </p>
                  </div>
                ) : (
                  <p className="mt-1 text-xl text-ink-600">No shot in the window yet for this lot.</p>
                )}
              </section>
            </div>
            <section className="min-w-0 rounded-2xl border border-steam-200 bg-white p-4">
              <ShotList shots={shots?.shots ?? []} timeZone={v.timeZone} locale={v.locale} />
            </section>
          </>
        )}
        <details className="text-base text-ink-600">
          <summary className="cursor-pointer underline underline-offset-4">Where the target comes from</summary>
          <p className="mt-1">
            The café&rsquo;s own target, set by the owner on the Beans screen: the dose range from the house double recipe, the yield as a ratio of the dose
            (yield ÷ dose, {formatRatio(w.ratioMinX10)}–{formatRatio(w.ratioMaxX10)}) and the shot time. Common practice is about 1:2 in about 25–30 s; a fast
            shot is under-extracted (grind finer), a slow one over-extracted (grind coarser). Change one thing at a time. Each test shot&rsquo;s dose is taken
            from the lot&rsquo;s stock.
          </p>
        </details>
      </main>
    </div>
  );
}

export const dialInRoute = (deps: RouteDeps) => ({
  Component: DialIn,
  handle: { title: 'Dial-in' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.dialIn.need);
    const v = await deps.queryClient.ensureQueryData(dialInQuery(deps.api));
    const lotId = chosenLot(v, new URL(request.url).searchParams);
    if (lotId !== null) await deps.queryClient.ensureQueryData(lotShotsQuery(deps.api, lotId));
    return null;
  },
});
