import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BudgetInput } from '@shared/schemas/roadmap';
import { api } from '@/lib/api';
import { roadmapKeys } from './roadmap';

/** PUT /api/accounts/:id/budgets (staff): what the grower will spend in a season, parts and labour. */
export function useSaveBudgetMutation(accountId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: BudgetInput) => api.put<{ budget: BudgetInput }>(`/api/accounts/${accountId}/budgets`, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: roadmapKeys.account(accountId) }),
  });
}
