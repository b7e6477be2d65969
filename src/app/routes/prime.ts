import type { SessionUser } from '@shared/schemas/auth';
import { meQueryOptions } from '@/features/auth/api/me';
import { queryClient } from '@/lib/query-client';

/*
 * Route loaders prime the query cache: they start the page's requests while its code loads,
 * but never wait for them or fail the navigation. The page's own queries show the loading,
 * error and empty states.
 */

export async function currentUserForLoader(): Promise<SessionUser | null> {
  try {
    return await queryClient.ensureQueryData(meQueryOptions());
  } catch {
    return null;
  }
}

export { queryClient };
