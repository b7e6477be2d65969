import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ReplacementInput } from '@shared/schemas/roadmap';
import { api } from '@/lib/api';
import { roadmapKeys, type RoadmapReplacement } from './roadmap';

/** POST /api/accounts/:id/replacements (staff): a toolbar or planter the grower will replace in a season. */
export function useCreateReplacementMutation(accountId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ReplacementInput) => api.post<{ replacement: RoadmapReplacement }>(`/api/accounts/${accountId}/replacements`, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: roadmapKeys.account(accountId) }),
  });
}

/** DELETE /api/replacements/:id (staff). */
export function useDeleteReplacementMutation(accountId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete<void>(`/api/replacements/${id}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: roadmapKeys.account(accountId) }),
  });
}
