import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { PlanterDetail } from '@/features/fleet/api/types';
import { api } from '@/lib/api';

export type { PlanterDetail };

export const planterSorts = ['name', '-name', 'account', '-account', 'rows', '-rows', 'modelYear', '-modelYear'] as const;
export type PlanterSort = (typeof planterSorts)[number];

export interface PlanterListFilters {
  page: number;
  pageSize: number;
  sort: PlanterSort;
  q?: string;
  minRows?: number;
}

export interface PlanterListItem {
  id: number;
  name: string;
  maker: string | null;
  modelYear: number | null;
  rows: number;
  rowSpacingIn: number;
  frameType: string;
  accountId: number;
  accountName: string;
  installCount: number;
}

export const planterKeys = {
  all: ['planters'] as const,
  lists: () => [...planterKeys.all, 'list'] as const,
  list: (filters: PlanterListFilters) => [...planterKeys.lists(), filters] as const,
  details: () => [...planterKeys.all, 'detail'] as const,
  detail: (id: number) => [...planterKeys.details(), id] as const,
};

/** GET /api/planters — across the accounts the user may see, paged and sorted on the server. */
export const planterListQueryOptions = (filters: PlanterListFilters) =>
  queryOptions({
    queryKey: planterKeys.list(filters),
    queryFn: ({ signal }) =>
      api.get<{ items: PlanterListItem[]; total: number }>(
        '/api/planters',
        { page: filters.page, pageSize: filters.pageSize, sort: filters.sort, q: filters.q, minRows: filters.minRows },
        signal,
      ),
    placeholderData: keepPreviousData,
  });

/** GET /api/planters/:id — toolbars, tractor and every install (removed ones too); 404 outside scope. */
export const planterDetailQueryOptions = (id: number) =>
  queryOptions({
    queryKey: planterKeys.detail(id),
    queryFn: ({ signal }) => api.get<{ planter: PlanterDetail }>(`/api/planters/${id}`, undefined, signal),
    select: (data) => data.planter,
  });
