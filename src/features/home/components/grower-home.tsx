import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { EmptyState, ErrorState, LoadingBlock } from '@/components/ui/states';
import { accountDetailQueryOptions } from '@/features/accounts/api/accounts';
import { AccountStatusBadge } from '@/features/accounts/components/account-status-badge';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { GrowerRoadmap } from '@/features/portal/components/grower-roadmap-page';
import { Panel } from './cards';

export function GrowerHome() {
  const user = useCurrentUser();
  const account = useQuery({ ...accountDetailQueryOptions(user.accountId ?? 0), enabled: user.accountId !== null });

  return (
    <>
      <title>Your operation · Rowpath</title>
      <PageHeader title="Your operation" description={account.data ? undefined : 'Your farm account with the dealership.'} />

      {user.accountId === null && (
        <EmptyState title="Your sign-in is not linked to a farm account yet">
          Ask your planting specialist or the dealership to link it.
        </EmptyState>
      )}
      {user.accountId !== null && account.isPending && <LoadingBlock label="Loading your operation…" />}
      {account.isError && (
        <ErrorState title="Your operation could not be loaded" message={account.error.message} onRetry={() => void account.refetch()} />
      )}
      {account.isSuccess && (
        <Panel title={account.data.name} titleId="grower-operation">
          <p className="flex flex-wrap items-center gap-3 text-lg text-ink-900">
            <span>
              {account.data.town}, {account.data.state}
            </span>
            <AccountStatusBadge status={account.data.status} />
          </p>
          {account.data.specialistName && (
            <p className="mt-2 text-loam-800">Your planting specialist: {account.data.specialistName}</p>
          )}
          <Link
            to={`/accounts/${account.data.id}`}
            className="-ml-2 mt-3 inline-flex min-h-11 items-center rounded px-2 font-semibold text-ink-700 underline underline-offset-4"
          >
            See your account details
          </Link>
        </Panel>
      )}

      {user.accountId !== null && (
        <div className="mt-6">
          <GrowerRoadmap accountId={user.accountId} headingLevel="h2" />
        </div>
      )}
    </>
  );
}
