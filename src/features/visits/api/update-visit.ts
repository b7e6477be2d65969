import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { VisitUpdateInput, VisitView } from '@shared/schemas/visits';
import { api } from '@/lib/api';
import { visitKeys } from './visits';

export interface UpdateVisitVariables {
  id: number;
  changes: Omit<VisitUpdateInput, 'version'>;
  version: number;
}

/** Everything that shows a visit's time or state: lists, candidates, week routes, map markers. */
export const VISIT_DEPENDENT_KEYS = [visitKeys.all, ['week-plans'], ['map']] as const;

/**
 * PATCH /api/visits/:id (staff). A refusal (400 outside_hours / outside_window, 409 overlap or
 * stale) changes nothing on the server; callers show error.message, which names the reason.
 */
export function useUpdateVisitMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, changes, version }: UpdateVisitVariables) => api.patch<{ visit: VisitView }>(`/api/visits/${id}`, { ...changes, version }),
    onSuccess: ({ visit }) => {
      queryClient.setQueryData(visitKeys.detail(visit.id), { visit });
      for (const key of VISIT_DEPENDENT_KEYS) void queryClient.invalidateQueries({ queryKey: key });
    },
  });
}
