import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AccountInput } from '@shared/schemas/accounts';
import { api } from '@/lib/api';
import { accountKeys, type AccountDetail } from './accounts';

export interface UpdateAccountVariables {
  id: number;
  /** The version this page loaded: a newer one on the server answers 409 "stale". */
  changes: Partial<AccountInput> & { version: number };
}

/** PATCH /api/accounts/:id (staff of the account's territory). */
export function useUpdateAccountMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, changes }: UpdateAccountVariables) => api.patch<{ account: AccountDetail }>(`/api/accounts/${id}`, changes),
    onSuccess: ({ account }) => {
      queryClient.setQueryData(accountKeys.detail(account.id), { account });
      void queryClient.invalidateQueries({ queryKey: accountKeys.audit(account.id) });
      return queryClient.invalidateQueries({ queryKey: accountKeys.lists() });
    },
  });
}

/** DELETE /api/accounts/:id (admin and manager): the whole fleet goes with it. */
export function useDeleteAccountMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete<void>(`/api/accounts/${id}`),
    onSuccess: (_data, id) => {
      queryClient.removeQueries({ queryKey: accountKeys.detail(id) });
      return queryClient.invalidateQueries({ queryKey: accountKeys.lists() });
    },
  });
}
