import { queryOptions } from '@tanstack/react-query';
import type { Api } from '@/lib/api';

export const sessionKeys = { all: ['session'] as const };

export const sessionQuery = (api: Api) => queryOptions({ queryKey: sessionKeys.all, queryFn: () => api.session(), staleTime: 60_000 });
