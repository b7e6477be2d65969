import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateUserInput } from '@shared/schemas/users';
import { api } from '@/lib/api';
import { authKeys } from '@/features/auth/api/me';
import { adminUserKeys, type AdminUser } from './users';

export interface UpdateUserVariables {
  id: number;
  changes: UpdateUserInput;
}

export function updateUser({ id, changes }: UpdateUserVariables): Promise<{ user: AdminUser }> {
  return api.patch<{ user: AdminUser }>(`/api/admin/users/${id}`, changes);
}

/**
 * PATCH /api/admin/users/:id (admins): name, role, territories, grower account, disabled.
 * The answer replaces that one row in the cached list; no refetch of the whole list.
 */
export function useUpdateUserMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: ({ user }) => {
      queryClient.setQueryData<{ items: AdminUser[] }>(adminUserKeys.list(), (data) =>
        data ? { ...data, items: data.items.map((item) => (item.id === user.id ? { ...item, ...user } : item)) } : data,
      );
      // An admin editing their own record: the header's name and role come from /me.
      const me = queryClient.getQueryData<{ id: number } | null>(authKeys.me());
      if (me?.id === user.id) void queryClient.invalidateQueries({ queryKey: authKeys.me() });
    },
  });
}
