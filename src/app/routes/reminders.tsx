import type { LoaderFunctionArgs } from 'react-router-dom';
import { Navigate } from 'react-router-dom';
import { RequireRole } from '@/features/auth/components/require-auth';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { CAMPAIGN_LIST, campaignListQueryOptions, seasonCalendarQueryOptions } from '@/features/reminders/api/reminders';
import { RemindersPage } from '@/features/reminders/components/reminders-page';
import { comingSeason, todayUtcIso } from '@/features/reminders/model/season';
import { currentUserForLoader, queryClient } from './prime';

const STAFF = ['admin', 'manager', 'specialist'] as const;

export function Component() {
  const user = useCurrentUser();
  // A grower's "Reminders" is their own preferences page.
  if (user.role === 'grower') return <Navigate to="/reminder-preferences" replace />;
  return (
    <RequireRole roles={STAFF}>
      <RemindersPage />
    </RequireRole>
  );
}

export async function loader({ request }: LoaderFunctionArgs) {
  const user = await currentUserForLoader();
  if (user && user.role !== 'grower') {
    const season = Number(new URL(request.url).searchParams.get('season')) || comingSeason(todayUtcIso());
    void queryClient.prefetchQuery(campaignListQueryOptions(CAMPAIGN_LIST));
    void queryClient.prefetchQuery(seasonCalendarQueryOptions(season));
  }
  return null;
}
