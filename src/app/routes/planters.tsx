import type { LoaderFunctionArgs } from 'react-router-dom';
import { RequireRole } from '@/features/auth/components/require-auth';
import { parsePlanterListParams } from '@/features/planters/api/list-params';
import { planterListQueryOptions } from '@/features/planters/api/planters';
import { PlantersPage } from '@/features/planters/components/planters-page';
import { currentUserForLoader, queryClient } from './prime';

export function Component() {
  return (
    <RequireRole roles={['admin', 'manager', 'specialist']}>
      <PlantersPage />
    </RequireRole>
  );
}

export async function loader({ request }: LoaderFunctionArgs) {
  const user = await currentUserForLoader();
  if (user && user.role !== 'grower') void queryClient.prefetchQuery(planterListQueryOptions(parsePlanterListParams(new URL(request.url).searchParams)));
  return null;
}
