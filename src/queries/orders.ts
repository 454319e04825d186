import { queryOptions } from '@tanstack/react-query';
import type { Api } from '@/lib/api';

export const orderKeys = {
  all: ['orders'] as const,
  list: (q: string) => ['orders', 'list', { q }] as const,
  detail: (id: number) => ['orders', 'detail', id] as const,
};

export const ordersQuery = (api: Api, q: string) => queryOptions({ queryKey: orderKeys.list(q), queryFn: () => api.orders({ q }), staleTime: 5_000 });

export const orderQuery = (api: Api, id: number) => queryOptions({ queryKey: orderKeys.detail(id), queryFn: () => api.order({ id }), staleTime: 30_000 });
