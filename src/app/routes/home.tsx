import { accountDetailQueryOptions, accountListQueryOptions } from '@/features/accounts/api/accounts';
import { adminUsersQueryOptions } from '@/features/admin-users/api/users';
import { firstAccountsFilters } from '@/features/home/components/specialist-home';
import { territoriesQueryOptions } from '@/features/territories/api/territories';
import { currentUserForLoader, queryClient } from './prime';

export { HomePage as Component } from '@/features/home/components/home-page';

export async function loader() {
  const user = await currentUserForLoader();
  switch (user?.role) {
    case 'admin':
      void queryClient.prefetchQuery(adminUsersQueryOptions());
      void queryClient.prefetchQuery(territoriesQueryOptions());
      void queryClient.prefetchQuery(accountListQueryOptions({ page: 1, pageSize: 1, sort: 'name' }));
      break;
    case 'manager':
      void queryClient.prefetchQuery(territoriesQueryOptions());
      break;
    case 'specialist':
      void queryClient.prefetchQuery(territoriesQueryOptions());
      void queryClient.prefetchQuery(accountListQueryOptions({ ...firstAccountsFilters }));
      break;
    case 'grower':
      if (user.accountId) void queryClient.prefetchQuery(accountDetailQueryOptions(user.accountId));
      break;
  }
  return null;
}
