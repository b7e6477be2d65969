import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { roadmapKeys, type Roadmap } from './roadmap';

/** POST /api/accounts/:id/roadmap/plan (staff): re-plans; locked, quoted and committed items stay. */
export function usePlanRoadmapMutation(accountId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (horizonSeasons: number) => api.post<Roadmap>(`/api/accounts/${accountId}/roadmap/plan`, { horizonSeasons }),
    onSuccess: (roadmap) => queryClient.setQueryData(roadmapKeys.account(accountId), roadmap),
  });
}
