import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { reminderKeys, type RunResult } from './reminders';

/** POST /api/campaigns/:id/run — enqueues the reminder due today; the sender is woken at once. */
export function useRunCampaignMutation(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<{ run: RunResult }>(`/api/campaigns/${id}/run`),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: reminderKeys.campaigns() });
      void queryClient.invalidateQueries({ queryKey: reminderKeys.outbox() });
    },
  });
}
