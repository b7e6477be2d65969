import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api';

export interface TestSendResult {
  sent: boolean;
  to: string;
  messageId: string;
  smtpResponse: string;
}

/** POST /api/campaigns/:id/test-send — one grower's message, marked as a test, to the user (or `to`). Nothing enters the outbox. */
export function useTestSendMutation(id: number) {
  return useMutation({
    mutationFn: (input: { contactId: number; to?: string }) => api.post<TestSendResult>(`/api/campaigns/${id}/test-send`, input),
  });
}
