// "Wait now ~6 min" in the Counter's header: what a customer who asks before paying would be told
// for the drinks picked so far (one, before any), read again whenever the bar moves. Read-only; the
// quote stored with the order is still made when it is sent.
import { keepPreviousData, useQuery, useSuspenseQuery } from '@tanstack/react-query';
import { cupsOf } from '@/domain/order-quantity';
import { aboutMinutes } from '@/domain/wait-now';
import { useApi } from '@/lib/api-context';
import { barBoardQuery } from '@/queries/board';
import { menuQuery } from '@/queries/menu';

export const waitNowKeys = { all: ['wait-now'] as const, of: (drinks: number, seq: number) => ['wait-now', drinks, seq] as const };

export function WaitNow({ items }: { items: { menuItemId: number; quantity?: number }[] }) {
  const api = useApi();
  const { data: menu } = useSuspenseQuery(menuQuery(api));
  const { data: board } = useSuspenseQuery(barBoardQuery(api));
  // "3 × Latte" is three drinks on the bar
  const drinks = Math.max(1, cupsOf(items.filter((l) => menu.items.find((i) => i.id === l.menuItemId)?.station === 'bar')));
  const { data } = useQuery({
    queryKey: waitNowKeys.of(drinks, board.seq),
    queryFn: () => api.waitNow({ drinks }),
    staleTime: 15_000,
    placeholderData: keepPreviousData,
  });
  if (!data) return null;
  const { seconds, drinksOnBar } = data.waitNow;
  const minutes = Math.max(1, Math.ceil(seconds / 60));
  const what = drinks === 1 ? 'a drink' : `${drinks} drinks`;
  return (
    <span data-testid="wait-now" className="text-lg" title={`If they order ${what} now: ready in ${aboutMinutes(seconds)} (${drinksOnBar} on the bar)`}>
      Wait now <strong>~{minutes} min</strong>
    </span>
  );
}
