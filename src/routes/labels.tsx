// Printable cup labels, one per bar drink: who, here (mug) or to go (cup), which drink, how it's
// made, and any allergy.
import { useSuspenseQuery } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router';
import { Button } from '@/components/ui/button';
import { ServiceMark } from '@/components/ui/service-mark';
import { orderQuery } from '@/queries/orders';
import { useApi } from '@/lib/api-context';
import { orNotFound, orderIdFrom, requireScreen, type RouteDeps } from './deps';
import { SCREENS } from '@/domain/screens';

function Labels() {
  const api = useApi();
  const { data } = useSuspenseQuery(orderQuery(api, Number(useParams().id)));
  const o = data.order;
  const drinks = o.lines.filter((l) => l.station === 'bar');
  const allergy = o.allergens.length > 0 || o.allergyNote;
  return (
    <main className="bg-white p-4 text-ink-900 print:p-0">
      <Button className="mb-4 print:hidden" onClick={() => window.print()}>
        Print {drinks.length} label{drinks.length === 1 ? '' : 's'}
      </Button>
      <div className="flex flex-wrap gap-3">
        {drinks.map((d, i) => (
          <section key={d.id} data-testid="cup-label" className="w-[2.25in] break-inside-avoid rounded-md border-2 border-ink-900 p-2 print:rounded-none">
            <p className="flex items-baseline justify-between">
              <span className="font-display text-2xl font-semibold">#{o.number}</span>
              <span className="text-sm">
                {i + 1} of {drinks.length}
              </span>
            </p>
            {/* the whole name, wrapped: a cut name on a cup is a drink collected by the wrong person */}
            <p className="text-lg leading-tight font-semibold [overflow-wrap:anywhere]">{o.customerName}</p>
            <ServiceMark service={o.service} className="text-base font-semibold" />
            <p className="font-semibold">
              {d.itemName}
              {d.sizeName ? ` · ${d.sizeName}` : ''}
            </p>
            <p className="text-sm">{[d.milkName, d.shots ? `${d.shots} shots` : null, ...d.extras].filter(Boolean).join(' · ')}</p>
            {d.note && <p className="text-sm">Note: {d.note}</p>}
            {allergy && (
              <p className="mt-1 border-2 border-ink-900 px-1 text-sm font-semibold">
                ⚠ ALLERGY: {[...o.allergens, o.allergyNote].filter(Boolean).join(' · ')}
              </p>
            )}
          </section>
        ))}
      </div>
    </main>
  );
}

export const labelsRoute = (deps: RouteDeps) => ({
  Component: Labels,
  handle: { title: 'Cup labels' },
  loader: async ({ request, params }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.labels.need);
    await orNotFound(deps.queryClient.ensureQueryData(orderQuery(deps.api, orderIdFrom(params))));
    return null;
  },
});
