import type { LoaderFunctionArgs } from 'react-router-dom';
import { accountDetailQueryOptions } from '@/features/accounts/api/accounts';
import { quotesQueryOptions } from '@/features/quotes/api/quotes';
import { roadmapQueryOptions } from '@/features/roadmap/api/roadmap';
import { parseRoadmapAccountId } from '@/features/roadmap/components/roadmap-page';
import { queryClient } from './prime';

export { RoadmapPage as Component } from '@/features/roadmap/components/roadmap-page';

/** Starts the roadmap, the account's name and its quotes while the page's code arrives. */
export function loader({ params }: LoaderFunctionArgs) {
  const id = parseRoadmapAccountId(params.accountId);
  if (id !== null) {
    void queryClient.prefetchQuery(roadmapQueryOptions(id));
    void queryClient.prefetchQuery(accountDetailQueryOptions(id));
    void queryClient.prefetchQuery(quotesQueryOptions(id));
  }
  return null;
}
