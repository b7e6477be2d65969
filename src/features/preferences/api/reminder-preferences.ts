import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { ReminderPreferencesInput } from '@shared/schemas/reminders';
import { api } from '@/lib/api';

export interface PreferenceContact {
  id: number;
  name: string;
  email: string | null;
  reminderOptIn: boolean;
  unsubscribedAt: string | null;
  /** Whether reminders reach this contact now. */
  receivesReminders: boolean;
}

export interface ReminderPreferences {
  account: { id: number; name: string };
  contacts: PreferenceContact[];
}

export const preferenceKeys = {
  all: ['reminder-preferences'] as const,
  mine: () => [...preferenceKeys.all, 'me'] as const,
};

/** GET /api/me/reminder-preferences — growers: their own account's contacts. */
export const reminderPreferencesQueryOptions = () =>
  queryOptions({
    queryKey: preferenceKeys.mine(),
    queryFn: ({ signal }) => api.get<ReminderPreferences>('/api/me/reminder-preferences', undefined, signal),
  });

/** PUT /api/me/reminder-preferences — turning a contact on again also clears an earlier unsubscribe. */
export function useSaveReminderPreferencesMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ReminderPreferencesInput) => api.put<ReminderPreferences>('/api/me/reminder-preferences', input),
    onSuccess: (data) => queryClient.setQueryData(preferenceKeys.mine(), data),
  });
}
