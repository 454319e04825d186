import { queryOptions } from '@tanstack/react-query';
import type { Api } from '@/lib/api';

export const settingsKeys = { all: ['settings'] as const };

export const settingsQuery = (api: Api) => queryOptions({ queryKey: settingsKeys.all, queryFn: () => api.settings(), staleTime: 30_000 });
