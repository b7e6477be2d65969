import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { RoadmapStageName } from '@shared/schemas/roadmap';
import { roadmapKeys } from '@/features/roadmap/api/roadmap';
import { api } from '@/lib/api';

export type QuoteStatus = 'open' | 'accepted' | 'declined' | 'expired';

export interface QuoteItem {
  id: number;
  partNumber: string;
  partName: string;
  planterName: string | null;
  quantity: number;
  partsUsd: number;
  labourHours: number;
  labourUsd: number;
  stage: RoadmapStageName;
}

export interface Quote {
  id: number;
  accountId: number;
  season: number;
  status: QuoteStatus;
  validUntil: string;
  partsUsd: number;
  labourUsd: number;
  totalUsd: number;
  createdAt: string;
  decidedAt: string | null;
  items: QuoteItem[];
}

export const quoteKeys = {
  all: ['quotes'] as const,
  lists: () => [...quoteKeys.all, 'list'] as const,
  list: (accountId: number) => [...quoteKeys.lists(), accountId] as const,
};

/** GET /api/accounts/:id/quotes — newest first; staff of the account and its grower. */
export const quotesQueryOptions = (accountId: number) =>
  queryOptions({
    queryKey: quoteKeys.list(accountId),
    queryFn: ({ signal }) => api.get<{ items: Quote[] }>(`/api/accounts/${accountId}/quotes`, undefined, signal),
    select: (data) => data.items,
  });

/** The printable quote; the session cookie authorises the download. */
export const quotePdfUrl = (quoteId: number) => `/api/quotes/${quoteId}/pdf`;

/** POST /api/accounts/:id/quotes (staff): quotes the season's open items; they become 'quoted'. */
export function useCreateQuoteMutation(accountId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (season: number) => api.post<{ quote: Quote }>(`/api/accounts/${accountId}/quotes`, { season }),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: roadmapKeys.account(accountId) });
      return queryClient.invalidateQueries({ queryKey: quoteKeys.list(accountId) });
    },
  });
}

/** POST /api/quotes/:id/accept|decline — the account's grower only; 409 once decided or expired. */
export function useDecideQuoteMutation(accountId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ quoteId, decision }: { quoteId: number; decision: 'accept' | 'decline' }) => api.post<{ quote: Quote }>(`/api/quotes/${quoteId}/${decision}`),
    onSettled: () => {
      void queryClient.invalidateQueries({ queryKey: roadmapKeys.account(accountId) });
      return queryClient.invalidateQueries({ queryKey: quoteKeys.list(accountId) });
    },
  });
}
