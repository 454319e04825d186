// Query keys and options for the card check.
import { queryOptions } from '@tanstack/react-query';
import type { Api } from '@/lib/api';

export const cardCheckKeys = {
  all: ['card-check'] as const,
  /** `date` undefined: the café's today */
  day: (date: string | undefined) => ['card-check', date ?? 'today'] as const,
};

export const cardCheckQuery = (api: Api, date: string | undefined) =>
  queryOptions({ queryKey: cardCheckKeys.day(date), queryFn: () => api.cardCheck({ date }), staleTime: 15_000 });
