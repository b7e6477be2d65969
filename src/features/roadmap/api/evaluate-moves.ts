import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api';
import type { MoveEvaluation } from './types';

/** POST /api/accounts/:id/roadmap/evaluate: what the roadmap would waste and warn if items moved. Saves nothing. */
export function evaluateMoves(accountId: number, moves: { itemId: number; season: number }[]): Promise<MoveEvaluation> {
  return api.post<MoveEvaluation>(`/api/accounts/${accountId}/roadmap/evaluate`, { moves });
}

export function useEvaluateMovesMutation(accountId: number) {
  return useMutation({ mutationFn: (moves: { itemId: number; season: number }[]) => evaluateMoves(accountId, moves) });
}
