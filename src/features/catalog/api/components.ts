import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { ComponentCategory } from '@shared/schemas/fleet';
import type { CatalogComponent } from '@/features/fleet/api/types';
import { api } from '@/lib/api';

export type { CatalogComponent };

export const catalogSorts = ['category', '-category', 'name', '-name', 'partNumber', '-partNumber', 'priceUsd', '-priceUsd'] as const;
export type CatalogSort = (typeof catalogSorts)[number];

export interface CatalogFilters {
  page: number;
  pageSize: number;
  sort: CatalogSort;
  q?: string;
  category?: ComponentCategory;
  active?: 'true' | 'false';
}

export interface CatalogListResponse {
  items: CatalogComponent[];
  total: number;
}

export const catalogKeys = {
  all: ['catalog'] as const,
  lists: () => [...catalogKeys.all, 'list'] as const,
  list: (filters: CatalogFilters) => [...catalogKeys.lists(), filters] as const,
  picker: () => [...catalogKeys.all, 'picker'] as const,
};

/** GET /api/components — staff only; paged, sorted and searched on the server. */
export const catalogListQueryOptions = (filters: CatalogFilters) =>
  queryOptions({
    queryKey: catalogKeys.list(filters),
    queryFn: ({ signal }) =>
      api.get<CatalogListResponse>(
        '/api/components',
        { page: filters.page, pageSize: filters.pageSize, sort: filters.sort, q: filters.q, category: filters.category, active: filters.active },
        signal,
      ),
    placeholderData: keepPreviousData,
  });

/**
 * Every active part at once, for the install form's picker: a dealer's catalog is tens to a few
 * hundred parts (the server's page limit is 500), so the picker filters in the browser as you type.
 */
export const catalogPickerQueryOptions = () =>
  queryOptions({
    queryKey: catalogKeys.picker(),
    queryFn: ({ signal }) => api.get<CatalogListResponse>('/api/components', { page: 1, pageSize: 500, sort: 'category', active: 'true' }, signal),
    select: (data) => data.items,
    staleTime: 5 * 60_000,
  });
