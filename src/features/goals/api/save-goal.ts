import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { GoalInput } from '@shared/schemas/roadmap';
import { roadmapKeys, type RoadmapGoal } from '@/features/roadmap/api/roadmap';
import { api } from '@/lib/api';

/*
 * The grower's goals live on the roadmap's answer (GET /api/accounts/:id/roadmap lists them), so
 * every change refreshes that one query.
 */

/** POST /api/accounts/:id/goals (staff). 400 names the field (a past season, a planter not theirs). */
export function useCreateGoalMutation(accountId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: GoalInput) => api.post<{ goal: RoadmapGoal }>(`/api/accounts/${accountId}/goals`, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: roadmapKeys.account(accountId) }),
  });
}

/** PATCH /api/goals/:id (staff) with the version loaded; 409 'stale' if someone saved first. */
export function useUpdateGoalMutation(accountId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, changes }: { id: number; changes: Partial<GoalInput> & { version: number } }) => api.patch<{ goal: RoadmapGoal }>(`/api/goals/${id}`, changes),
    onSettled: () => queryClient.invalidateQueries({ queryKey: roadmapKeys.account(accountId) }),
  });
}

/** DELETE /api/goals/:id (staff). */
export function useDeleteGoalMutation(accountId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete<void>(`/api/goals/${id}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: roadmapKeys.account(accountId) }),
  });
}
