import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { AccountStatus, AcresByCrop } from '@shared/schemas/accounts';
import { api } from '@/lib/api';
import type { AccountPlanter, AuditEntry, Contact, FarmSite, Tractor } from '@/features/fleet/api/types';

export type { AccountStatus, AcresByCrop };

export interface AccountSummary {
  id: number;
  name: string;
  status: AccountStatus;
  town: string;
  state: string;
  territoryId: number;
  territoryName: string | null;
  specialistId: number | null;
  specialistName: string | null;
  lat: number | null;
  lng: number | null;
}

export interface AccountDetail extends AccountSummary {
  address: string | null;
  notes: string | null;
  acresByCrop: AcresByCrop;
  /** Optimistic lock: sent back with every change. */
  version: number;
  updatedAt: string;
  contacts: Contact[];
  farmSites: FarmSite[];
  tractors: Tractor[];
  planters: AccountPlanter[];
}

/** Sort keys the list page offers (a subset of what the server accepts). */
export const accountSorts = ['name', '-name', 'town', '-town', 'status', '-status'] as const;
export type AccountSort = (typeof accountSorts)[number];

export interface AccountListFilters {
  page: number;
  pageSize: number;
  sort: AccountSort;
  q?: string;
  territoryId?: number;
}

export interface AccountListResponse {
  items: AccountSummary[];
  total: number;
}

export const accountKeys = {
  all: ['accounts'] as const,
  lists: () => [...accountKeys.all, 'list'] as const,
  list: (filters: AccountListFilters) => [...accountKeys.lists(), filters] as const,
  details: () => [...accountKeys.all, 'detail'] as const,
  detail: (id: number) => [...accountKeys.details(), id] as const,
  audit: (id: number) => [...accountKeys.detail(id), 'audit'] as const,
};

/** GET /api/accounts — the server limits rows to the user's scope (all, territories, own). */
export const accountListQueryOptions = (filters: AccountListFilters) =>
  queryOptions({
    queryKey: accountKeys.list(filters),
    queryFn: ({ signal }) =>
      api.get<AccountListResponse>(
        '/api/accounts',
        {
          page: filters.page,
          pageSize: filters.pageSize,
          sort: filters.sort,
          q: filters.q,
          territoryId: filters.territoryId,
        },
        signal,
      ),
    // Keep the old page on screen while the next one loads: no flash of skeletons when paging.
    placeholderData: keepPreviousData,
  });

/** GET /api/accounts/:id — 404 when missing or outside the user's scope. */
export const accountDetailQueryOptions = (id: number) =>
  queryOptions({
    queryKey: accountKeys.detail(id),
    queryFn: ({ signal }) => api.get<{ account: AccountDetail }>(`/api/accounts/${id}`, undefined, signal),
    select: (data) => data.account,
  });

export const accountStatusLabels: Record<AccountStatus, string> = {
  active: 'Active',
  prospect: 'Prospect',
  inactive: 'Inactive',
};

/** GET /api/accounts/:id/audit — who changed what on the account's records, newest first. */
export const accountAuditQueryOptions = (id: number) =>
  queryOptions({
    queryKey: accountKeys.audit(id),
    queryFn: ({ signal }) => api.get<{ items: AuditEntry[] }>(`/api/accounts/${id}/audit`, undefined, signal),
    select: (data) => data.items,
  });
