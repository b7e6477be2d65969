import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { EmptyState, ErrorState, LoadingBlock } from '@/components/ui/states';
import { accountListQueryOptions } from '@/features/accounts/api/accounts';
import { AccountStatusBadge } from '@/features/accounts/components/account-status-badge';
import { territoriesQueryOptions } from '@/features/territories/api/territories';
import { ComingNote, Panel, StatCard, countFormat } from './cards';

export const firstAccountsFilters = { page: 1, pageSize: 5, sort: 'name' } as const;

export function SpecialistHome() {
  const territories = useQuery(territoriesQueryOptions());
  const accounts = useQuery(accountListQueryOptions({ ...firstAccountsFilters }));
  const territoryNames = territories.data?.map((t) => t.name) ?? [];

  return (
    <>
      <title>Territory overview · Rowpath</title>
      <PageHeader
        title="Territory overview"
        description={
          territories.isSuccess && territoryNames.length > 0
            ? `Your territory: ${territoryNames.join(', ')}.`
            : 'The accounts you look after.'
        }
      />

      {territories.isError && (
        <ErrorState title="Your territory could not be loaded" message={territories.error.message} onRetry={() => void territories.refetch()} />
      )}
      {territories.isSuccess && territories.data.length === 0 && (
        <EmptyState title="No territory assigned yet">Ask your Rowpath administrator to assign you a territory.</EmptyState>
      )}

      {(territories.isPending || (territories.data?.length ?? 0) > 0) && (
        <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,2fr)]">
          <div className="space-y-4">
            <StatCard label="Accounts in your territory" value={accounts.data?.total} loading={accounts.isPending} to="/accounts" linkLabel="Open the account list" />
            {territories.data?.map((territory) => (
              <div key={territory.id} className="rounded-xl border border-loam-200 bg-white px-5 py-4 shadow-sm">
                <p className="font-semibold text-ink-900">{territory.name}</p>
                <p className="text-loam-700">
                  {territory.region} · <span className="tabular">{countFormat.format(territory.accountCount)}</span>{' '}
                  {territory.accountCount === 1 ? 'account' : 'accounts'}
                </p>
              </div>
            ))}
          </div>

          <Panel title="Accounts, A to Z" titleId="first-accounts">
            {accounts.isPending && <LoadingBlock label="Loading accounts…" />}
            {accounts.isError && (
              <ErrorState title="Accounts could not be loaded" message={accounts.error.message} onRetry={() => void accounts.refetch()} />
            )}
            {accounts.isSuccess && accounts.data.items.length === 0 && (
              <EmptyState title="No accounts in your territory yet">They will be listed here once they are added.</EmptyState>
            )}
            {accounts.isSuccess && accounts.data.items.length > 0 && (
              <>
                <ul className="divide-y divide-loam-200">
                  {accounts.data.items.map((account) => (
                    <li key={account.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                      <span>
                        <Link
                          to={`/accounts/${account.id}`}
                          className="inline-flex min-h-11 items-center font-semibold text-ink-800 underline decoration-ink-300 underline-offset-4 hover:decoration-ink-800"
                        >
                          {account.name}
                        </Link>
                        <span className="ml-2 text-loam-700">
                          {account.town}, {account.state}
                        </span>
                      </span>
                      <AccountStatusBadge status={account.status} />
                    </li>
                  ))}
                </ul>
                {accounts.data.total > accounts.data.items.length && (
                  <Link to="/accounts" className="-ml-2 mt-2 inline-flex min-h-11 items-center rounded px-2 font-semibold text-ink-700 underline underline-offset-4">
                    See all {countFormat.format(accounts.data.total)} accounts
                  </Link>
                )}
              </>
            )}
          </Panel>
        </div>
      )}

      <div className="mt-6">
        <ComingNote>Visits, upgrade roadmaps and pre-season reminders will show here as they are added to Rowpath.</ComingNote>
      </div>
    </>
  );
}
