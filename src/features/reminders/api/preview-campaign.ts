import { queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { reminderKeys, type Preview } from './reminders';

export interface PreviewRequest {
  contactId: number;
  /** The template as typed (not yet saved); the stored one is used when absent. */
  subject?: string;
  body?: string;
}

/**
 * POST /api/campaigns/:id/preview — one grower's message as they will read it. A POST that
 * changes nothing, so it is cached like a read, keyed by what is being previewed.
 */
export const previewQueryOptions = (id: number, request: PreviewRequest) =>
  queryOptions({
    queryKey: [...reminderKeys.campaign(id), 'preview', request] as const,
    queryFn: () => api.post<{ preview: Preview }>(`/api/campaigns/${id}/preview`, request),
    select: (data) => data.preview,
    staleTime: 30_000,
    retry: false,
  });
