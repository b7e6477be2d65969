import { adminUsersQueryOptions } from '@/features/admin-users/api/users';
import { UsersPage } from '@/features/admin-users/components/users-page';
import { RequireRole } from '@/features/auth/components/require-auth';
import { territoriesQueryOptions } from '@/features/territories/api/territories';
import { currentUserForLoader, queryClient } from './prime';

export function Component() {
  return (
    <RequireRole roles={['admin']}>
      <UsersPage />
    </RequireRole>
  );
}

export async function loader() {
  const user = await currentUserForLoader();
  if (user?.role === 'admin') {
    void queryClient.prefetchQuery(adminUsersQueryOptions());
    void queryClient.prefetchQuery(territoriesQueryOptions());
  }
  return null;
}
