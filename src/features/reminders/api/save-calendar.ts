import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SeasonWindowInput } from '@shared/schemas/reminders';
import { api } from '@/lib/api';
import { reminderKeys, type CalendarEntry } from './reminders';

/** PUT /api/season-calendar (admin and manager): sets or resets windows; campaigns follow at once. */
export function useSaveCalendarMutation(season: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (entries: Partial<SeasonWindowInput>[]) => api.put<{ entries: CalendarEntry[] }>(`/api/season-calendar?season=${season}`, { entries }),
    onSuccess: (data) => {
      queryClient.setQueryData(reminderKeys.calendar(season), data);
      void queryClient.invalidateQueries({ queryKey: [...reminderKeys.all, 'calendar'] });
      // Send dates hang on the windows.
      void queryClient.invalidateQueries({ queryKey: reminderKeys.campaigns() });
    },
  });
}
