import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PlanterInput } from '@shared/schemas/fleet';
import { accountKeys } from '@/features/accounts/api/accounts';
import { api } from '@/lib/api';
import { planterKeys, type PlanterDetail } from './planters';

export type SavePlanterVariables =
  | { mode: 'create'; accountId: number; input: PlanterInput }
  /** PUT sends the whole planter with its toolbars (existing ones with their ids) and the loaded version. */
  | { mode: 'update'; id: number; input: PlanterInput; version: number };

/** POST /api/accounts/:id/planters or PUT /api/planters/:id (staff of the account's territory). */
export function useSavePlanterMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (v: SavePlanterVariables) =>
      (v.mode === 'create'
        ? api.post<{ planter: PlanterDetail }>(`/api/accounts/${v.accountId}/planters`, v.input)
        : api.put<{ planter: PlanterDetail }>(`/api/planters/${v.id}`, { ...v.input, version: v.version })
      ).then((body) => body.planter),
    onSuccess: (planter) => {
      queryClient.setQueryData(planterKeys.detail(planter.id), { planter });
      void queryClient.invalidateQueries({ queryKey: planterKeys.lists() });
      return queryClient.invalidateQueries({ queryKey: accountKeys.detail(planter.accountId) });
    },
  });
}

/** DELETE /api/planters/:id: its toolbars and install records go with it. */
export function useDeletePlanterMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id }: { id: number; accountId: number }) => api.delete<void>(`/api/planters/${id}`),
    onSuccess: (_data, { id, accountId }) => {
      queryClient.removeQueries({ queryKey: planterKeys.detail(id) });
      void queryClient.invalidateQueries({ queryKey: planterKeys.lists() });
      return queryClient.invalidateQueries({ queryKey: accountKeys.detail(accountId) });
    },
  });
}
