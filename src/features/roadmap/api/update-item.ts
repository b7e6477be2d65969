import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RoadmapItemPatch } from '@shared/schemas/roadmap';
import { api } from '@/lib/api';
import { roadmapKeys, type Roadmap } from './roadmap';

export interface UpdateItemResult {
  roadmap: Roadmap;
  /** Waste added, goals made late, budgets exceeded, parts that no longer work. */
  warnings: string[];
}

/**
 * PATCH /api/roadmap-items/:id (staff): move, re-stage or lock an item. 409 'locked' when the item
 * is locked in its season, 409 'stale' when someone changed it since it was loaded.
 */
export function useUpdateItemMutation(accountId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, patch }: { id: number; patch: RoadmapItemPatch }) => api.patch<UpdateItemResult>(`/api/roadmap-items/${id}`, patch),
    onSuccess: ({ roadmap }) => queryClient.setQueryData(roadmapKeys.account(accountId), roadmap),
    onError: () => queryClient.invalidateQueries({ queryKey: roadmapKeys.account(accountId) }),
  });
}
