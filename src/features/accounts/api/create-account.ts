import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AccountInput } from '@shared/schemas/accounts';
import { api } from '@/lib/api';
import { accountKeys, type AccountDetail } from './accounts';

/** POST /api/accounts (admin, manager, specialist; in their own territories). */
export function useCreateAccountMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: AccountInput) => api.post<{ account: AccountDetail }>('/api/accounts', input),
    onSuccess: ({ account }) => {
      queryClient.setQueryData(accountKeys.detail(account.id), { account });
      return queryClient.invalidateQueries({ queryKey: accountKeys.lists() });
    },
  });
}
