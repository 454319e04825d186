// The Outbox: mail the local SMTP fake caught. Mail arrives on its own schedule (after the SMTP
// hand-off), so the list is polled gently while the screen is open.
import { queryOptions } from '@tanstack/react-query';
import type { Api } from '@/lib/api';

export const outboxKeys = { all: ['outbox'] as const };

export const outboxQuery = (api: Api) => queryOptions({ queryKey: outboxKeys.all, queryFn: () => api.outbox(), staleTime: 5_000, refetchInterval: 10_000 });
