import { queryOptions } from '@tanstack/react-query';
import type { SessionUser } from '@shared/schemas/auth';
import { api, isApiError } from '@/lib/api';

export type { SessionUser };

export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
};

/**
 * The signed-in user, or null when there is no session (401). "Not signed in" is an ordinary
 * answer here, not an error, so guards can redirect without an error screen.
 */
export async function fetchMe(signal?: AbortSignal): Promise<SessionUser | null> {
  try {
    const { user } = await api.get<{ user: SessionUser }>('/api/auth/me', undefined, signal);
    return user;
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}

export const meQueryOptions = () =>
  queryOptions({
    queryKey: authKeys.me(),
    queryFn: ({ signal }) => fetchMe(signal),
    staleTime: 5 * 60_000,
  });
