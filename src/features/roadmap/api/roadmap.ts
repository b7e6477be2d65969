import { queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api';
import type { Roadmap, RoadmapVersionDetail, RoadmapVersionSummary } from './types';

export type * from './types';

export const roadmapKeys = {
  all: ['roadmap'] as const,
  accounts: () => [...roadmapKeys.all, 'account'] as const,
  account: (accountId: number) => [...roadmapKeys.accounts(), accountId] as const,
  versions: (accountId: number) => [...roadmapKeys.account(accountId), 'versions'] as const,
  version: (versionId: number) => [...roadmapKeys.all, 'version', versionId] as const,
};

/** GET /api/accounts/:id/roadmap — anyone who may see the account (growers their own). */
export const roadmapQueryOptions = (accountId: number) =>
  queryOptions({
    queryKey: roadmapKeys.account(accountId),
    queryFn: ({ signal }) => api.get<Roadmap>(`/api/accounts/${accountId}/roadmap`, undefined, signal),
  });

/** GET /api/accounts/:id/roadmap/versions — newest first. */
export const roadmapVersionsQueryOptions = (accountId: number) =>
  queryOptions({
    queryKey: roadmapKeys.versions(accountId),
    queryFn: ({ signal }) => api.get<{ items: RoadmapVersionSummary[] }>(`/api/accounts/${accountId}/roadmap/versions`, undefined, signal),
    select: (data) => data.items,
  });

/** GET /api/roadmap-versions/:id — a saved snapshot; it never changes, so it is never refetched. */
export const roadmapVersionQueryOptions = (versionId: number) =>
  queryOptions({
    queryKey: roadmapKeys.version(versionId),
    queryFn: ({ signal }) => api.get<{ version: RoadmapVersionDetail }>(`/api/roadmap-versions/${versionId}`, undefined, signal),
    select: (data) => data.version,
    staleTime: Infinity,
  });
