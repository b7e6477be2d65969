import type { LoaderFunctionArgs } from 'react-router-dom';
import { planterDetailQueryOptions } from '@/features/planters/api/planters';
import { parsePlanterId } from '@/features/planters/components/planter-page';
import { queryClient } from './prime';

export { PlanterPage as Component } from '@/features/planters/components/planter-page';

export function loader({ params }: LoaderFunctionArgs) {
  const id = parsePlanterId(params.planterId);
  if (id !== null) void queryClient.prefetchQuery(planterDetailQueryOptions(id));
  return null;
}
