import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { QuotaInput, QuotaRow } from '@shared/schemas/forecast';
import { api } from '@/lib/api';
import { forecastKeys } from './forecast';

/** PUT /api/quotas — admin and managers; a quota below zero is refused (400, field quotaUsd). */
export function usePutQuotaMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: QuotaInput) => api.put<{ quota: QuotaRow }>('/api/quotas', input),
    onSuccess: (_data, input) => queryClient.invalidateQueries({ queryKey: forecastKeys.quota(input.season) }),
  });
}
