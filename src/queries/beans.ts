// Query keys and options for the owner's Beans screen.
import { queryOptions } from '@tanstack/react-query';
import type { Api } from '@/lib/api';

export const beanKeys = {
  all: ['beans'] as const,
  lots: () => ['beans', 'lots'] as const,
};

export const beansQuery = (api: Api) => queryOptions({ queryKey: beanKeys.lots(), queryFn: () => api.beans(), staleTime: 15_000 });
