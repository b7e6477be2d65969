import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link, useLocation, useSearchParams } from 'react-router-dom';
import { workingWidthFt } from '@shared/calc/sizing';
import { Button } from '@/components/ui/button';
import { useServerTable } from '@/lib/use-server-table';
import { useUrlSearch } from '@/lib/use-url-search';
import { DataTable } from '@/components/ui/data-table';
import { inputClasses } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { Pagination } from '@/components/ui/pagination';
import { EmptyState, ErrorState } from '@/components/ui/states';
import { formatNumber, frameTypeLabels, labelOf } from '@/features/fleet/lib/labels';
import { minRowChoices, parsePlanterListParams, planterPageSizes, toPlanterListParams } from '../api/list-params';
import { planterListQueryOptions, type PlanterListFilters, type PlanterListItem, type PlanterSort } from '../api/planters';

const column = createColumnHelper<PlanterListItem>();

const columns = [
  column.accessor('name', {
    header: 'Planter',
    cell: (info) => (
      <Link to={`/planters/${info.row.original.id}`} className="inline-flex min-h-11 items-center font-semibold text-ink-800 underline decoration-ink-300 underline-offset-4 hover:decoration-ink-800">
        {info.getValue()}
      </Link>
    ),
  }),
  column.accessor('accountName', {
    id: 'account',
    header: 'Account',
    cell: (info) => <AccountLink id={info.row.original.accountId} name={info.getValue()} />,
  }),
  column.accessor('rows', {
    header: 'Rows',
    meta: { align: 'right' },
    cell: (info) => (
      <span className="whitespace-nowrap">
        {info.getValue()} × {formatNumber(info.row.original.rowSpacingIn)} in
      </span>
    ),
  }),
  column.display({
    id: 'width',
    header: 'Width',
    meta: { align: 'right', className: 'hidden md:table-cell' },
    cell: (info) => `${formatNumber(workingWidthFt(info.row.original.rows, info.row.original.rowSpacingIn))} ft`,
  }),
  column.accessor('maker', { header: 'Maker', enableSorting: false, meta: { className: 'hidden lg:table-cell' }, cell: (info) => info.getValue() ?? <span className="text-loam-700">—</span> }),
  column.accessor('modelYear', { header: 'Year', meta: { align: 'right', className: 'hidden lg:table-cell' }, cell: (info) => info.getValue() ?? <span className="text-loam-700">—</span> }),
  column.accessor('frameType', { header: 'Frame', enableSorting: false, meta: { className: 'hidden xl:table-cell' }, cell: (info) => labelOf(frameTypeLabels, info.getValue()) }),
  column.accessor('installCount', { header: 'Parts on it', enableSorting: false, meta: { align: 'right' }, cell: (info) => info.getValue() }),
];

function AccountLink({ id, name }: { id: number; name: string }) {
  const location = useLocation();
  return (
    <Link to={`/accounts/${id}`} state={{ fromList: location.search }} className="inline-flex min-h-11 items-center text-ink-800 underline decoration-loam-300 underline-offset-4 hover:decoration-ink-800">
      {name}
    </Link>
  );
}

/** Every planter the user may see, across accounts: paged, sorted and searched on the server. */
export function PlantersPage() {
  const [searchParams, setSearchParams] = useSearchParams();
  const filters = useMemo(() => parsePlanterListParams(searchParams), [searchParams]);
  const setFilters = (patch: Partial<PlanterListFilters>, options: { replace?: boolean } = {}) =>
    setSearchParams((current) => toPlanterListParams({ ...parsePlanterListParams(current), ...patch }), { replace: options.replace ?? false });
  const planters = useQuery(planterListQueryOptions(filters));

  const [searchText, setSearchText] = useUrlSearch(filters.q, (q) => setFilters({ q, page: 1 }, { replace: true }));

  const table = useServerTable({
    rows: planters.data?.items,
    total: planters.data?.total,
    columns,
    sort: filters.sort,
    page: filters.page,
    pageSize: filters.pageSize,
    onSort: (sort) => setFilters({ sort, page: 1 }),
  });
  const total = planters.data?.total ?? 0;
  const filtered = Boolean(filters.q || filters.minRows);
  const clear = () => {
    setSearchText('');
    setFilters({ q: undefined, minRows: undefined, page: 1 });
  };

  return (
    <>
      <title>Planters · Rowpath</title>
      <PageHeader title="Planters" description="Every planter in the accounts you look after. Open one to see its drawing and what is installed on each row." />
      <form
        role="search"
        aria-label="Planters"
        className="mb-4 flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          setFilters({ q: searchText.trim() || undefined, page: 1 });
        }}
      >
        <div className="min-w-60 flex-1 sm:max-w-md">
          <label htmlFor="planter-search" className="mb-1 block font-semibold text-ink-900">
            Search planters
          </label>
          <input id="planter-search" type="search" className={inputClasses} placeholder="Planter, maker or account" value={searchText} onChange={(e) => setSearchText(e.target.value)} autoComplete="off" />
        </div>
        <div className="min-w-40">
          <label htmlFor="planter-min-rows" className="mb-1 block font-semibold text-ink-900">
            Size
          </label>
          <select id="planter-min-rows" className={inputClasses} value={filters.minRows ?? ''} onChange={(e) => setFilters({ minRows: e.target.value ? Number(e.target.value) : undefined, page: 1 })}>
            <option value="">Any number of rows</option>
            {minRowChoices.map((n) => (
              <option key={n} value={n}>
                {n} rows or more
              </option>
            ))}
          </select>
        </div>
        {filtered && (
          <Button variant="ghost" onClick={clear}>
            Clear filters
          </Button>
        )}
      </form>
      {planters.isError ? (
        <ErrorState title="Planters could not be loaded" message={planters.error.message} onRetry={() => void planters.refetch()} retrying={planters.isFetching} />
      ) : (
        <>
          <DataTable
            table={table}
            caption="Planters"
            isLoading={planters.isPending}
            isRefreshing={planters.isPlaceholderData}
            empty={
              filtered ? (
                <EmptyState title="No planters match these filters" action={<Button variant="secondary" onClick={clear}>Clear filters</Button>}>
                  Search looks at planter names, makers and account names.
                </EmptyState>
              ) : (
                <EmptyState title="No planters yet">Planters are added from each account's page.</EmptyState>
              )
            }
          />
          {!planters.isPending && total > 0 && (
            <Pagination
              page={filters.page}
              pageSize={filters.pageSize}
              total={total}
              noun={total === 1 ? 'planter' : 'planters'}
              pageSizes={[...planterPageSizes]}
              onPageChange={(page) => setFilters({ page })}
              onPageSizeChange={(pageSize) => setFilters({ pageSize, page: 1 })}
            />
          )}
        </>
      )}
    </>
  );
}
