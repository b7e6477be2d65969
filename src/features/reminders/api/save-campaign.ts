import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CampaignInput, CampaignUpdate } from '@shared/schemas/reminders';
import { api } from '@/lib/api';
import { reminderKeys, type Campaign } from './reminders';

/** POST /api/campaigns (staff, their own territories). */
export function useCreateCampaignMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CampaignInput) => api.post<{ campaign: Campaign }>('/api/campaigns', input),
    onSuccess: ({ campaign }) => {
      queryClient.setQueryData(reminderKeys.campaign(campaign.id), { campaign });
      void queryClient.invalidateQueries({ queryKey: [...reminderKeys.campaigns(), 'list'] });
    },
  });
}

/** PATCH /api/campaigns/:id with the version read; 409 'stale' when someone saved in between. */
export function useUpdateCampaignMutation(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (changes: CampaignUpdate) => api.patch<{ campaign: Campaign }>(`/api/campaigns/${id}`, changes),
    onSuccess: ({ campaign }) => {
      queryClient.setQueryData(reminderKeys.campaign(id), { campaign });
      void queryClient.invalidateQueries({ queryKey: [...reminderKeys.campaigns(), 'list'] });
      // Who is in the audience and what they read may have changed with it.
      void queryClient.invalidateQueries({ queryKey: [...reminderKeys.campaign(id), 'audience'] });
      void queryClient.invalidateQueries({ queryKey: [...reminderKeys.campaign(id), 'preview'] });
      // Pausing holds queued messages; resuming releases them.
      void queryClient.invalidateQueries({ queryKey: reminderKeys.outbox() });
    },
  });
}
