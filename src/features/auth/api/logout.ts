import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, forgetCsrfToken, isApiError } from '@/lib/api';
import { authKeys } from './me';

export async function logout(): Promise<void> {
  try {
    await api.post<void>('/api/auth/logout');
  } catch (error) {
    // Already signed out (expired or ended elsewhere): the goal is reached.
    if (isApiError(error) && error.status === 401) return;
    throw error;
  }
}

/** POST /api/auth/logout, then forget every cached answer of this user. */
export function useLogoutMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: logout,
    onSuccess: () => {
      forgetCsrfToken();
      queryClient.clear();
      queryClient.setQueryData(authKeys.me(), null);
    },
  });
}
