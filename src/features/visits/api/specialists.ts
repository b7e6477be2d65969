import { useQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { accountListQueryOptions } from '@/features/accounts/api/accounts';
import { adminUsersQueryOptions } from '@/features/admin-users/api/users';
import { useCurrentUser } from '@/features/auth/components/current-user';

export interface SpecialistChoice {
  id: number;
  name: string;
}

/**
 * Whose visits a user may plan or view. A specialist: themself. An administrator: every active
 * specialist (the user list). A manager: the specialists serving accounts in their territories
 * (Rowpath has no staff directory for managers; the accounts list names them).
 */
export function useSpecialistChoices(): { choices: SpecialistChoice[]; loading: boolean } {
  const me = useCurrentUser();
  const admin = me.role === 'admin';
  const manager = me.role === 'manager';
  const users = useQuery({ ...adminUsersQueryOptions(), enabled: admin });
  const accounts = useQuery({ ...accountListQueryOptions({ page: 1, pageSize: 200, sort: 'name' }), enabled: manager });
  return useMemo(() => {
    const found = new Map<number, string>();
    if (me.role === 'specialist') found.set(me.id, me.name);
    if (admin) for (const u of users.data ?? []) if (u.role === 'specialist' && !u.disabled) found.set(u.id, u.name);
    if (manager) for (const a of accounts.data?.items ?? []) if (a.specialistId && a.specialistName) found.set(a.specialistId, a.specialistName);
    return {
      choices: [...found].map(([id, name]) => ({ id, name })).sort((a, b) => a.name.localeCompare(b.name)),
      loading: (admin && users.isPending) || (manager && accounts.isPending),
    };
  }, [me, admin, manager, users.data, users.isPending, accounts.data, accounts.isPending]);
}
