import { visitListQueryOptions } from '@/features/visits/api/visits';
import { calendarLinksQueryOptions } from '@/features/calendar/api/calendar-links';
import { currentUserForLoader, queryClient } from './prime';

export { GrowerVisitsPage as Component } from '@/features/visits/components/grower-visits-page';

export async function loader() {
  const user = await currentUserForLoader();
  if (user?.role === 'grower' && user.accountId) {
    void queryClient.prefetchQuery(visitListQueryOptions({ accountId: user.accountId }));
    void queryClient.prefetchQuery(calendarLinksQueryOptions());
  }
  return null;
}
