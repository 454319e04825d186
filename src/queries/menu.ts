import { queryOptions } from '@tanstack/react-query';
import type { Api } from '@/lib/api';

export const menuKeys = { all: ['menu'] as const };

export const menuQuery = (api: Api) => queryOptions({ queryKey: menuKeys.all, queryFn: () => api.menu(), staleTime: 5 * 60_000 });
