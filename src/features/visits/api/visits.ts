import { queryOptions } from '@tanstack/react-query';
import type { VisitCandidate, VisitView } from '@shared/schemas/visits';
import { api } from '@/lib/api';

export type { VisitCandidate, VisitView };

export interface VisitListFilters {
  /** ISO dates: visits starting in [from, to), at the dealership's midnights. */
  from?: string;
  to?: string;
  specialistId?: number;
  accountId?: number;
  /** Comma-separated statuses. */
  status?: string;
}

export interface CandidateFilters {
  weekStart: string;
  specialistId?: number;
}

export interface CandidatesResponse {
  weekStart: string;
  season: number;
  checkupsSince: string;
  items: VisitCandidate[];
}

export const visitKeys = {
  all: ['visits'] as const,
  lists: () => [...visitKeys.all, 'list'] as const,
  list: (filters: VisitListFilters) => [...visitKeys.lists(), filters] as const,
  details: () => [...visitKeys.all, 'detail'] as const,
  detail: (id: number) => [...visitKeys.details(), id] as const,
  candidateLists: () => [...visitKeys.all, 'candidates'] as const,
  candidates: (filters: CandidateFilters) => [...visitKeys.candidateLists(), filters] as const,
};

/** GET /api/visits — the server keeps to the user's scope (a grower sees their own account's). */
export const visitListQueryOptions = (filters: VisitListFilters) =>
  queryOptions({
    queryKey: visitKeys.list(filters),
    queryFn: ({ signal }) =>
      api.get<{ items: VisitView[]; total: number }>(
        '/api/visits',
        { from: filters.from, to: filters.to, specialistId: filters.specialistId, accountId: filters.accountId, status: filters.status, pageSize: 2000 },
        signal,
      ),
  });

/** GET /api/visits/:id — 404 outside the user's scope. */
export const visitDetailQueryOptions = (id: number) =>
  queryOptions({
    queryKey: visitKeys.detail(id),
    queryFn: ({ signal }) => api.get<{ visit: VisitView }>(`/api/visits/${id}`, undefined, signal),
    select: (data) => data.visit,
  });

/** GET /api/visits/candidates — staff: requests, due check-ups and overdue reviews for a week. */
export const candidatesQueryOptions = (filters: CandidateFilters) =>
  queryOptions({
    queryKey: visitKeys.candidates(filters),
    queryFn: ({ signal }) => api.get<CandidatesResponse>('/api/visits/candidates', { weekStart: filters.weekStart, specialistId: filters.specialistId }, signal),
  });
