// The board (open tickets, or the Pickup board's view) is loaded once and then kept current by
// live events, so it never goes stale by time.
import { queryOptions } from '@tanstack/react-query';
import type { Api } from '@/lib/api';

export const boardKeys = {
  all: ['board'] as const,
  bar: ['board', 'bar'] as const,
  pickup: ['board', 'pickup'] as const,
};

/** Open tickets and those ready a short while (the bar's recall tray, the Counter's glance). */
export const barBoardQuery = (api: Api) => queryOptions({ queryKey: boardKeys.bar, queryFn: () => api.tickets({ view: 'board' }), staleTime: Infinity });

export const pickupBoardQuery = (api: Api) => queryOptions({ queryKey: boardKeys.pickup, queryFn: () => api.pickup(), staleTime: Infinity });
