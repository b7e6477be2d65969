import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { reminderKeys, type OutboxMessage } from './reminders';

/** POST /api/outbox/:id/retry — a failed message back to pending; 409 when the contact has unsubscribed since. */
export function useRetryMessageMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.post<{ message: OutboxMessage }>(`/api/outbox/${id}/retry`),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: reminderKeys.outbox() });
      void queryClient.invalidateQueries({ queryKey: reminderKeys.campaigns() });
    },
  });
}
