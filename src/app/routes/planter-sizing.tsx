import type { LoaderFunctionArgs } from 'react-router-dom';
import { accountTractorsQueryOptions, planterForSizingQueryOptions } from '@/features/sizing/api/sizing-queries';
import { parsePlanterId } from '@/features/sizing/components/planter-sizing-page';
import { queryClient } from './prime';

export { PlanterSizingPage as Component } from '@/features/sizing/components/planter-sizing-page';

/** Starts loading the planter, then its operation's tractors, while the page's code arrives. */
export function loader({ params }: LoaderFunctionArgs) {
  const id = parsePlanterId(params.id);
  if (id !== null) {
    void queryClient
      .fetchQuery(planterForSizingQueryOptions(id))
      .then((data) => queryClient.prefetchQuery(accountTractorsQueryOptions(data.planter.accountId)))
      .catch(() => undefined);
  }
  return null;
}
