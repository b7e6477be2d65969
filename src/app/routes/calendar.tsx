import type { LoaderFunctionArgs } from 'react-router-dom';
import { isIsoDate, parseCalendarView, rangeOfView, routesWeekOf } from '@/features/calendar/model/events';
import { visitListQueryOptions } from '@/features/visits/api/visits';
import { todayAtDealership } from '@/features/visits/model/zone-time';
import { currentWeekRoutesQueryOptions } from '@/features/week-plan/api/week-plans';
import { currentUserForLoader, queryClient } from './prime';

export { CalendarPage as Component } from '@/features/calendar/components/calendar-page';

export async function loader({ request }: LoaderFunctionArgs) {
  const user = await currentUserForLoader();
  if (user?.role === 'specialist') {
    const params = new URL(request.url).searchParams;
    const dateParam = params.get('date');
    const date = isIsoDate(dateParam) ? dateParam : todayAtDealership();
    const { from, to } = rangeOfView(parseCalendarView(params.get('view')), date);
    void queryClient.prefetchQuery(visitListQueryOptions({ from, to, specialistId: user.id, status: 'requested,planned,done' }));
    void queryClient.prefetchQuery(currentWeekRoutesQueryOptions({ weekStart: routesWeekOf(date), specialistId: user.id, days: 5 }));
  }
  return null;
}
