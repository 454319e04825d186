// Query keys and options for the dial-in log and the Bar's "on the grinder" strip.
import { queryOptions } from '@tanstack/react-query';
import type { Api } from '@/lib/api';

export const dialInKeys = {
  all: ['dial-in'] as const,
  view: () => ['dial-in', 'view'] as const,
  shots: (lotId: number) => ['dial-in', 'shots', lotId] as const,
};

export const dialInQuery = (api: Api) => queryOptions({ queryKey: dialInKeys.view(), queryFn: () => api.dialIn(), staleTime: 10_000 });

export const lotShotsQuery = (api: Api, lotId: number) =>
  queryOptions({ queryKey: dialInKeys.shots(lotId), queryFn: () => api.lotShots({ id: lotId }), staleTime: 10_000 });
