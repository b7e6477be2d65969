import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';

export interface CalendarLinks {
  feedUrl: string;
  webcalUrl: string;
  path: string;
  scope: 'specialist' | 'grower' | 'territories' | 'all';
  refreshMinutes: number;
  createdAt: string;
}

export const calendarLinkKeys = {
  all: ['calendar-links'] as const,
  mine: () => [...calendarLinkKeys.all, 'me'] as const,
};

/** GET /api/me/calendar-links — the signed-in user's own secret feed address (made on first use). */
export const calendarLinksQueryOptions = () =>
  queryOptions({
    queryKey: calendarLinkKeys.mine(),
    queryFn: ({ signal }) => api.get<CalendarLinks>('/api/me/calendar-links', undefined, signal),
    staleTime: 10 * 60_000,
  });

/** POST /api/me/calendar-links/rotate — a new address; every copy of the old one stops working. */
export function useRotateCalendarLinkMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<CalendarLinks>('/api/me/calendar-links/rotate'),
    onSuccess: (links) => queryClient.setQueryData(calendarLinkKeys.mine(), links),
  });
}
