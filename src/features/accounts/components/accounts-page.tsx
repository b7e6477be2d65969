import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { Link, useLocation, useNavigate, useSearchParams } from 'react-router-dom';
import { Button, buttonClasses } from '@/components/ui/button';
import { useServerTable } from '@/lib/use-server-table';
import { useUrlSearch } from '@/lib/use-url-search';
import { Dialog } from '@/components/ui/dialog';
import { DataTable } from '@/components/ui/data-table';
import { inputClasses } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { Pagination } from '@/components/ui/pagination';
import { EmptyState, ErrorState } from '@/components/ui/states';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { territoriesQueryOptions } from '@/features/territories/api/territories';
import { accountListQueryOptions, type AccountListFilters, type AccountSort, type AccountSummary } from '../api/accounts';
import { accountPageSizes, parseAccountListParams, toAccountListParams } from '../api/list-params';
import { useCreateAccountMutation } from '../api/create-account';
import { accountsExportHref } from '../api/import-accounts';
import { Notice } from '@/features/fleet/components/form-bits';
import { AccountForm } from './account-form';
import { AccountStatusBadge } from './account-status-badge';
import { ImportAccountsPanel } from './import-accounts-panel';

const column = createColumnHelper<AccountSummary>();

// Defined once: a new array on every render would make the table rebuild its columns.
const columns = [
  column.accessor('name', {
    header: 'Account',
    cell: (info) => <AccountLink account={info.row.original} />,
  }),
  column.accessor('status', {
    header: 'Status',
    cell: (info) => <AccountStatusBadge status={info.getValue()} />,
  }),
  column.accessor('town', {
    header: 'Town',
    cell: (info) => `${info.getValue()}, ${info.row.original.state}`,
  }),
  column.accessor('territoryName', {
    header: 'Territory',
    enableSorting: false,
    cell: (info) => info.getValue() ?? <span className="text-loam-700">None</span>,
    meta: { className: 'hidden md:table-cell' },
  }),
  column.accessor('specialistName', {
    header: 'Specialist',
    enableSorting: false,
    cell: (info) => info.getValue() ?? <span className="text-loam-700">Unassigned</span>,
    meta: { className: 'hidden lg:table-cell' },
  }),
];

function AccountLink({ account }: { account: AccountSummary }) {
  const location = useLocation();
  return (
    <Link
      to={`/accounts/${account.id}`}
      state={{ fromList: location.search }}
      className="inline-flex min-h-11 items-center font-semibold text-ink-800 underline decoration-ink-300 underline-offset-4 hover:decoration-ink-800"
    >
      {account.name}
    </Link>
  );
}

const descriptions = {
  admin: 'Every account at the dealership.',
  manager: 'Accounts in the territories you manage.',
  specialist: 'Accounts in your territory.',
  grower: 'Your own account.',
} as const;

export function AccountsPage() {
  const user = useCurrentUser();
  const location = useLocation();
  const [searchParams, setSearchParams] = useSearchParams();
  const filters = useMemo(() => parseAccountListParams(searchParams), [searchParams]);

  // Patches the URL as it is now (not as this render saw it), so a delayed search cannot undo
  // a sort or page change made in the meantime.
  const setFilters = (patch: Partial<AccountListFilters>, options: { replace?: boolean } = {}) =>
    setSearchParams((current) => toAccountListParams({ ...parseAccountListParams(current), ...patch }), {
      replace: options.replace ?? false,
    });

  const accounts = useQuery(accountListQueryOptions(filters));
  const canFilterByTerritory = user.role !== 'grower';
  const isStaff = user.role !== 'grower';
  const [creating, setCreating] = useState(false);
  const [importing, setImporting] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const createAccount = useCreateAccountMutation();
  const navigate = useNavigate();
  const territories = useQuery({ ...territoriesQueryOptions(), enabled: canFilterByTerritory });

  // Search box: typed text is local; it reaches the URL (and the server) after a short pause.
  const [searchText, setSearchText] = useUrlSearch(filters.q, (q) => setFilters({ q, page: 1 }, { replace: true }));

  const table = useServerTable({
    rows: accounts.data?.items,
    total: accounts.data?.total,
    columns,
    sort: filters.sort,
    page: filters.page,
    pageSize: filters.pageSize,
    onSort: (sort) => setFilters({ sort, page: 1 }),
  });

  const total = accounts.data?.total ?? 0;
  const filtered = Boolean(filters.q || filters.territoryId);
  const pastLastPage = accounts.isSuccess && total > 0 && accounts.data.items.length === 0;

  return (
    <>
      <title>Accounts · Rowpath</title>
      <PageHeader
        title="Accounts"
        description={descriptions[user.role]}
        actions={
          <>
            <a href={accountsExportHref(filters)} download className={buttonClasses('secondary')}>
              <svg viewBox="0 0 20 20" className="size-5" aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round">
                <path d="M10 3v10M6 9l4 4 4-4M3.5 13.5v3h13v-3" />
              </svg>
              Export CSV
            </a>
            {isStaff && (
              <>
                <Button variant="secondary" onClick={() => setImporting(true)}>
                  Import CSV
                </Button>
                <Button onClick={() => setCreating(true)}>
                  <span aria-hidden="true" className="text-xl leading-none">+</span> Add an account
                </Button>
              </>
            )}
          </>
        }
      />
      <Notice message={notice} onDone={() => setNotice(null)} className="mb-4" />
      <Dialog open={creating} onClose={() => setCreating(false)} variant="panel" title="Add an account" description="A grower operation in one of your territories.">
        {creating && (
          <AccountForm
            account={null}
            busy={createAccount.isPending}
            onCancel={() => setCreating(false)}
            onSubmit={(input, handleError) =>
              createAccount.mutate(input, {
                onSuccess: ({ account }) => {
                  setCreating(false);
                  navigate(`/accounts/${account.id}`, { state: { fromList: location.search } });
                },
                onError: handleError,
              })
            }
          />
        )}
      </Dialog>
      <ImportAccountsPanel
        open={importing}
        onClose={() => setImporting(false)}
        onImported={(report) => {
          setImporting(false);
          setNotice(`${report.accountIds.length} ${report.accountIds.length === 1 ? 'account was' : 'accounts were'} imported with ${report.summary.contacts} ${report.summary.contacts === 1 ? 'contact' : 'contacts'}.`);
        }}
      />

      <form
        role="search"
        aria-label="Accounts"
        className="mb-4 flex flex-wrap items-end gap-3"
        onSubmit={(event) => {
          event.preventDefault();
          setFilters({ q: searchText.trim() || undefined, page: 1 });
        }}
      >
        <div className="min-w-60 flex-1 sm:max-w-md">
          <label htmlFor="account-search" className="mb-1 block font-semibold text-ink-900">
            Search accounts
          </label>
          <input
            id="account-search"
            type="search"
            className={inputClasses}
            placeholder="Account name or town"
            value={searchText}
            onChange={(event) => setSearchText(event.target.value)}
            autoComplete="off"
          />
        </div>
        {canFilterByTerritory && (territories.data?.length ?? 0) > 1 && (
          <div className="min-w-48">
            <label htmlFor="account-territory" className="mb-1 block font-semibold text-ink-900">
              Territory
            </label>
            <select
              id="account-territory"
              className={inputClasses}
              value={filters.territoryId ?? ''}
              onChange={(event) =>
                setFilters({ territoryId: event.target.value ? Number(event.target.value) : undefined, page: 1 })
              }
            >
              <option value="">All territories</option>
              {territories.data?.map((territory) => (
                <option key={territory.id} value={territory.id}>
                  {territory.name}
                </option>
              ))}
            </select>
          </div>
        )}
        {filtered && (
          <Button
            variant="ghost"
            onClick={() => {
              setSearchText('');
              setFilters({ q: undefined, territoryId: undefined, page: 1 });
            }}
          >
            Clear filters
          </Button>
        )}
      </form>

      {accounts.isError ? (
        <ErrorState
          title="Accounts could not be loaded"
          message={accounts.error.message}
          onRetry={() => void accounts.refetch()}
          retrying={accounts.isFetching}
        />
      ) : (
        <>
          <DataTable
            table={table}
            caption="Accounts"
            isLoading={accounts.isPending}
            isRefreshing={accounts.isPlaceholderData}
            empty={
              pastLastPage ? (
                <EmptyState
                  title="This page is past the end of the list"
                  action={<Button variant="secondary" onClick={() => setFilters({ page: 1 })}>Go to the first page</Button>}
                />
              ) : filtered ? (
                <EmptyState
                  title={filters.q ? `No accounts match “${filters.q}”` : 'No accounts in this territory'}
                  action={
                    <Button
                      variant="secondary"
                      onClick={() => {
                        setSearchText('');
                        setFilters({ q: undefined, territoryId: undefined, page: 1 });
                      }}
                    >
                      Clear filters
                    </Button>
                  }
                >
                  Search looks at account names and towns.
                </EmptyState>
              ) : (
                <EmptyState title="No accounts yet">
                  {user.role === 'admin'
                    ? 'Accounts will be listed here once they are added.'
                    : 'Accounts will be listed here once they are assigned to your territory.'}
                </EmptyState>
              )
            }
          />
          {!accounts.isPending && total > 0 && (
            <Pagination
              page={filters.page}
              pageSize={filters.pageSize}
              total={total}
              noun={total === 1 ? 'account' : 'accounts'}
              pageSizes={[...accountPageSizes]}
              onPageChange={(page) => setFilters({ page })}
              onPageSizeChange={(pageSize) => setFilters({ pageSize, page: 1 })}
            />
          )}
        </>
      )}
    </>
  );
}
