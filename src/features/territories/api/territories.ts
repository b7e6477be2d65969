import { queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api';

export interface Territory {
  id: number;
  name: string;
  region: string;
  accountCount: number;
}

export const territoryKeys = {
  all: ['territories'] as const,
  lists: () => [...territoryKeys.all, 'list'] as const,
  list: () => [...territoryKeys.lists()] as const,
};

/** GET /api/territories — admin: all; manager and specialist: their own; growers get 403. */
export const territoriesQueryOptions = () =>
  queryOptions({
    queryKey: territoryKeys.list(),
    queryFn: ({ signal }) => api.get<{ items: Territory[] }>('/api/territories', undefined, signal),
    select: (data) => data.items,
    staleTime: 5 * 60_000,
  });
