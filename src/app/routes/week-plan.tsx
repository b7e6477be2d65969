import type { LoaderFunctionArgs } from 'react-router-dom';
import { candidatesQueryOptions } from '@/features/visits/api/visits';
import { addDaysIso, mondayOf, todayAtDealership } from '@/features/visits/model/zone-time';
import { isIsoDate } from '@/features/calendar/model/events';
import { currentUserForLoader, queryClient } from './prime';

export { WeekPlanPage as Component } from '@/features/week-plan/components/week-plan-page';

export async function loader({ request }: LoaderFunctionArgs) {
  const user = await currentUserForLoader();
  // A specialist's own candidates can start loading with the page's code.
  if (user?.role === 'specialist') {
    const week = new URL(request.url).searchParams.get('week');
    const weekStart = isIsoDate(week) ? mondayOf(week) : addDaysIso(mondayOf(todayAtDealership()), 7);
    void queryClient.prefetchQuery(candidatesQueryOptions({ weekStart, specialistId: user.id }));
  }
  return null;
}
