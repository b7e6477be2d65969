import { queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api';
import type { PlanterSizingRecord, SizingTractor } from '../model/planter-what-if';

/*
 * The Sizing panel reads the planter once and computes everything in the browser: a what-if
 * never goes back to the server. The planter is not refetched on window focus, so figures do
 * not shift under the specialist's hands while they show a grower.
 */

export const sizingKeys = {
  all: ['sizing'] as const,
  planters: () => [...sizingKeys.all, 'planter'] as const,
  planter: (id: number) => [...sizingKeys.planters(), id] as const,
  tractors: (accountId: number) => [...sizingKeys.all, 'account-tractors', accountId] as const,
};

const FIVE_MINUTES = 5 * 60_000;

/** GET /api/planters/:id — the planter with its tractor and installs; 404 outside the user's scope. */
export const planterForSizingQueryOptions = (id: number) =>
  queryOptions({
    queryKey: sizingKeys.planter(id),
    queryFn: ({ signal }) => api.get<{ planter: PlanterSizingRecord }>(`/api/planters/${id}`, undefined, signal),
    select: (data) => data.planter,
    staleTime: FIVE_MINUTES,
    refetchOnWindowFocus: false,
  });

/** GET /api/accounts/:id — only its tractors, for the what-if tractor choice. */
export const accountTractorsQueryOptions = (accountId: number) =>
  queryOptions({
    queryKey: sizingKeys.tractors(accountId),
    queryFn: ({ signal }) => api.get<{ account: { tractors: SizingTractor[] } }>(`/api/accounts/${accountId}`, undefined, signal),
    select: (data) => data.account.tractors,
    staleTime: FIVE_MINUTES,
    refetchOnWindowFocus: false,
  });
