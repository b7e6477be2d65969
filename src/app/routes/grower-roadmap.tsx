import { RequireRole } from '@/features/auth/components/require-auth';
import { GrowerRoadmapPage } from '@/features/portal/components/grower-roadmap-page';
import { quotesQueryOptions } from '@/features/quotes/api/quotes';
import { roadmapQueryOptions } from '@/features/roadmap/api/roadmap';
import { currentUserForLoader, queryClient } from './prime';

export function Component() {
  return (
    <RequireRole roles={['grower']}>
      <GrowerRoadmapPage />
    </RequireRole>
  );
}

export async function loader() {
  const user = await currentUserForLoader();
  if (user?.role === 'grower' && user.accountId) {
    void queryClient.prefetchQuery(roadmapQueryOptions(user.accountId));
    void queryClient.prefetchQuery(quotesQueryOptions(user.accountId));
  }
  return null;
}
