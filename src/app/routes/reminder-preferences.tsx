import { RequireRole } from '@/features/auth/components/require-auth';
import { reminderPreferencesQueryOptions } from '@/features/preferences/api/reminder-preferences';
import { ReminderPreferencesPage } from '@/features/preferences/components/reminder-preferences-page';
import { currentUserForLoader, queryClient } from './prime';

export function Component() {
  return (
    <RequireRole roles={['grower']}>
      <ReminderPreferencesPage />
    </RequireRole>
  );
}

export async function loader() {
  const user = await currentUserForLoader();
  if (user?.role === 'grower') void queryClient.prefetchQuery(reminderPreferencesQueryOptions());
  return null;
}
