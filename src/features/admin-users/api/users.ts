import { queryOptions } from '@tanstack/react-query';
import type { Role } from '@shared/schemas/auth';
import { api } from '@/lib/api';

export interface AdminUser {
  id: number;
  email: string;
  name: string;
  role: Role;
  disabled: boolean;
  territoryIds: number[];
  accountId: number | null;
  lastSignInAt: string | null;
}

export const adminUserKeys = {
  all: ['admin-users'] as const,
  lists: () => [...adminUserKeys.all, 'list'] as const,
  list: () => [...adminUserKeys.lists()] as const,
};

/** GET /api/admin/users — admins only. */
export const adminUsersQueryOptions = () =>
  queryOptions({
    queryKey: adminUserKeys.list(),
    queryFn: ({ signal }) => api.get<{ items: AdminUser[] }>('/api/admin/users', undefined, signal),
    select: (data) => data.items,
  });
