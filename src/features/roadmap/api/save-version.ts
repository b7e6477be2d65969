import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { roadmapKeys } from './roadmap';

/** POST /api/accounts/:id/roadmap/versions (staff): a named snapshot of the roadmap as it stands. */
export function useSaveVersionMutation(accountId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (name: string) => api.post<{ version: { id: number; name: string; createdAt: string } }>(`/api/accounts/${accountId}/roadmap/versions`, { name }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: roadmapKeys.versions(accountId) }),
  });
}
