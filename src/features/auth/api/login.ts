import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LoginInput, SessionUser } from '@shared/schemas/auth';
import { api, forgetCsrfToken } from '@/lib/api';
import { authKeys } from './me';

export function login(input: LoginInput): Promise<{ user: SessionUser }> {
  return api.post<{ user: SessionUser }>('/api/auth/login', input);
}

/** POST /api/auth/login. The server issues a new CSRF token with the new session. */
export function useLoginMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: login,
    onSuccess: ({ user }) => {
      forgetCsrfToken();
      // Anything cached belonged to no one or to someone else: start clean for this user.
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== authKeys.all[0] });
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}
