import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateUserInput } from '@shared/schemas/users';
import { api } from '@/lib/api';
import { adminUserKeys, type AdminUser } from './users';

export function createUser(input: CreateUserInput): Promise<{ user: AdminUser }> {
  return api.post<{ user: AdminUser }>('/api/admin/users', input);
}

/** POST /api/admin/users (admins). 400 carries field messages; 409 means the e-mail is taken. */
export function useCreateUserMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createUser,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: adminUserKeys.lists() }),
  });
}
