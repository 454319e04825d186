import { queryOptions } from '@tanstack/react-query';
import type { Api } from '@/lib/api';

export const pulseKeys = { all: ['pulse'] as const };

export const pulseQuery = (api: Api) => queryOptions({ queryKey: pulseKeys.all, queryFn: () => api.pulse(), staleTime: 5_000 });
