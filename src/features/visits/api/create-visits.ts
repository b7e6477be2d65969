import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { VisitPurpose, VisitView } from '@shared/schemas/visits';
import { api } from '@/lib/api';
import { VISIT_DEPENDENT_KEYS } from './update-visit';

export interface NewVisit {
  accountId: number;
  purpose: VisitPurpose;
  specialistId?: number | null;
  status?: 'requested' | 'planned';
  windowStartMin?: number | null;
  windowEndMin?: number | null;
  notes?: string | null;
}

/** POST /api/visits/batch (staff): one transaction; a refusal names visits.<k>.<field>. */
export function useCreateVisitsMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (visits: NewVisit[]) => api.post<{ visits: VisitView[] }>('/api/visits/batch', { visits }),
    onSuccess: () => {
      for (const key of VISIT_DEPENDENT_KEYS) void queryClient.invalidateQueries({ queryKey: key });
    },
  });
}

/** POST /api/visits: a grower asks for a visit on their own account (status requested, no time). */
export function useRequestVisitMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (visit: NewVisit) => api.post<{ visit: VisitView }>('/api/visits', { ...visit, status: 'requested' }),
    onSuccess: () => {
      for (const key of VISIT_DEPENDENT_KEYS) void queryClient.invalidateQueries({ queryKey: key });
    },
  });
}
