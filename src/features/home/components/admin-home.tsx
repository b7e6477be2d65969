import { useQuery } from '@tanstack/react-query';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorState } from '@/components/ui/states';
import { accountListQueryOptions } from '@/features/accounts/api/accounts';
import { adminUsersQueryOptions } from '@/features/admin-users/api/users';
import { territoriesQueryOptions } from '@/features/territories/api/territories';
import { ComingNote, StatCard } from './cards';

export function AdminHome() {
  const users = useQuery(adminUsersQueryOptions());
  const territories = useQuery(territoriesQueryOptions());
  // One row is enough: only the total is wanted.
  const accounts = useQuery(accountListQueryOptions({ page: 1, pageSize: 1, sort: 'name' }));
  const activeUsers = users.data?.filter((u) => !u.disabled).length;
  const failed = [users, territories, accounts].find((q) => q.isError);

  return (
    <>
      <title>Administration overview · Rowpath</title>
      <PageHeader title="Administration overview" description="People, territories and accounts at the dealership." />

      {failed?.error && (
        <div className="mb-6">
          <ErrorState
            title="Some figures could not be loaded"
            message={failed.error.message}
            onRetry={() => {
              void users.refetch();
              void territories.refetch();
              void accounts.refetch();
            }}
          />
        </div>
      )}

      <div className="grid gap-4 sm:grid-cols-2 xl:grid-cols-4">
        <StatCard label="Users" value={users.data?.length} loading={users.isPending} to="/admin/users" linkLabel="Manage users" />
        <StatCard label="Active users" value={activeUsers} loading={users.isPending} />
        <StatCard label="Territories" value={territories.data?.length} loading={territories.isPending} />
        <StatCard label="Accounts" value={accounts.data?.total} loading={accounts.isPending} to="/accounts" linkLabel="Open the account list" />
      </div>

      <div className="mt-6">
        <ComingNote>The parts catalog and dealership settings will be managed here as they are added to Rowpath.</ComingNote>
      </div>
    </>
  );
}
