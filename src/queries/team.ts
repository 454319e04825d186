// Query keys and options of the team area: the owner's list, a welcome link, the switch list.
import { queryOptions } from '@tanstack/react-query';
import type { Api } from '@/lib/api';

export const teamKeys = {
  all: ['team'] as const,
  list: () => [...teamKeys.all, 'list'] as const,
  welcome: (token: string) => [...teamKeys.all, 'welcome', token] as const,
  switchPeople: () => [...teamKeys.all, 'switch-people'] as const,
};

export const teamQuery = (api: Api) => queryOptions({ queryKey: teamKeys.list(), queryFn: () => api.team(), staleTime: 10_000 });

export const welcomeQuery = (api: Api, token: string) =>
  queryOptions({ queryKey: teamKeys.welcome(token), queryFn: () => api.welcome({ token }), staleTime: 60_000, retry: false });

export const switchPeopleQuery = (api: Api) => queryOptions({ queryKey: teamKeys.switchPeople(), queryFn: () => api.switchPeople(), staleTime: 30_000 });
