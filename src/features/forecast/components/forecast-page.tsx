import { useQuery } from '@tanstack/react-query';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { useEffect, useMemo, useRef, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { Button, buttonClasses } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import { inputClasses } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { EmptyState, ErrorState } from '@/components/ui/states';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { territoriesQueryOptions } from '@/features/territories/api/territories';
import { ShopCapacitySection } from '@/features/shop-capacity/components/shop-capacity-section';
import { forecastExportHref, forecastQueryOptions, type DrillTarget, type ForecastRow } from '../api/forecast';
import {
  currentSeason,
  groupByLabels,
  hasNarrowingFilters,
  pageGroupBys,
  parseForecastParams,
  toForecastParams,
  type ForecastFilters,
} from '../api/forecast-params';
import { formatUsd } from '../api/format';
import { DrillDownDialog } from './drill-down-dialog';
import { ForecastChart } from './forecast-chart';
import { QuotaPanel } from './quota-panel';
import { SeasonPanels } from './season-panels';
import './forecast-print.css';

const column = createColumnHelper<ForecastRow>();

/** Opens the drill-down for a row; set by the page through the table's meta. */
interface TableMeta {
  onDrill: (row: ForecastRow) => void;
}

// Defined once: a new array on every render would make the table rebuild its columns.
const columns = [
  column.accessor('label', {
    header: 'Group',
    cell: (info) => (
      <button
        type="button"
        onClick={() => (info.table.options.meta as TableMeta).onDrill(info.row.original)}
        className="inline-flex min-h-11 items-center gap-2 text-left font-semibold text-ink-800 underline decoration-ink-300 underline-offset-4 hover:decoration-ink-800"
        data-drill-row={info.row.original.key}
      >
        {info.getValue()}
        <span className="sr-only">: show the items</span>
      </button>
    ),
  }),
  column.accessor('pipelineUsd', { header: 'Pipeline', meta: { align: 'right' }, cell: (info) => formatUsd(info.getValue()) }),
  column.accessor('weightedUsd', {
    header: 'Weighted',
    meta: { align: 'right' },
    cell: (info) => <span className="font-semibold">{formatUsd(info.getValue())}</span>,
  }),
  column.accessor('actualUsd', { header: 'Actual (installed)', meta: { align: 'right' }, cell: (info) => formatUsd(info.getValue()) }),
  column.accessor('itemCount', { header: 'Items', meta: { align: 'right', className: 'hidden sm:table-cell' } }),
];

const descriptions = {
  admin: 'Expected revenue from every roadmap item at the dealership, with quotas and the shop’s install weeks.',
  manager: 'Expected revenue from the roadmap items in your territories, with quotas and the shop’s install weeks.',
  specialist: 'Expected revenue from your own roadmap items, and the shop’s install weeks.',
  grower: '',
} as const;

function FilterSelect({
  id,
  label,
  value,
  onChange,
  options,
  className = 'min-w-40',
}: {
  id: string;
  label: string;
  value: string;
  onChange: (value: string) => void;
  options: { value: string; label: string }[];
  className?: string;
}) {
  return (
    <div className={className}>
      <label htmlFor={id} className="mb-1 block font-semibold text-ink-900">
        {label}
      </label>
      <select id={id} className={inputClasses} value={value} onChange={(event) => onChange(event.target.value)}>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </div>
  );
}

export function ForecastPage() {
  const user = useCurrentUser();
  const isManager = user.role === 'admin' || user.role === 'manager';
  const [searchParams, setSearchParams] = useSearchParams();
  const filters = useMemo(() => parseForecastParams(searchParams), [searchParams]);
  // A filter change reaches the URL only when the router's navigation settles; a second change
  // made before then (two selects in quick succession) builds on the first, not on the old URL.
  const pendingParams = useRef<URLSearchParams | null>(null);
  useEffect(() => {
    pendingParams.current = null;
  }, [searchParams]);
  const setFilters = (patch: Partial<ForecastFilters>) => {
    const next = toForecastParams({ ...parseForecastParams(pendingParams.current ?? searchParams), ...patch });
    pendingParams.current = next;
    setSearchParams(next);
  };
  const clearFilters = () => {
    pendingParams.current = null;
    setSearchParams(toForecastParams({ groupBy: filters.groupBy }));
  };

  const thisSeason = currentSeason(new Date());
  // The panels, quotas and shop weeks follow the chosen season, or the one being sold now.
  const focusSeason = filters.season ?? thisSeason;

  const result = useQuery(forecastQueryOptions(filters));
  const territories = useQuery(territoriesQueryOptions());
  // Filter choices: every specialist and category with items in the user's scope.
  const specialists = useQuery({ ...forecastQueryOptions({ groupBy: 'specialist' }), enabled: user.role !== 'specialist', placeholderData: undefined });
  const categories = useQuery({ ...forecastQueryOptions({ groupBy: 'category' }), placeholderData: undefined });

  const [drill, setDrill] = useState<DrillTarget | null>(null);
  const drillRow = (row: ForecastRow) => setDrill({ filters, key: row.key, label: row.label });

  const rows = result.data?.rows ?? [];
  const table = useReactTable({
    data: rows,
    columns,
    getRowId: (row) => row.key,
    getCoreRowModel: getCoreRowModel(),
    enableSorting: false,
    meta: { onDrill: drillRow } satisfies TableMeta,
  });

  const seasonOptions = [
    { value: '', label: 'All seasons' },
    ...Array.from({ length: 6 }, (_, i) => thisSeason - 1 + i).map((s) => ({ value: String(s), label: `${s} season` })),
  ];
  if (filters.season && !seasonOptions.some((o) => o.value === String(filters.season))) {
    seasonOptions.push({ value: String(filters.season), label: `${filters.season} season` });
  }
  const groupLabel = groupByLabels[filters.groupBy];
  const filtered = hasNarrowingFilters(filters);

  return (
    <div data-print-page="forecast">
      <title>Forecast · Rowpath</title>
      <PageHeader
        title="Forecast"
        description={descriptions[user.role]}
        actions={
          <div className="flex flex-wrap gap-2 print:hidden">
            <a href={forecastExportHref(filters)} download className={buttonClasses('secondary')} data-export-csv>
              <svg viewBox="0 0 20 20" className="size-5" aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round">
                <path d="M10 3v10M6 9l4 4 4-4M3.5 13.5v3h13v-3" />
              </svg>
              Export CSV
            </a>
            <Button variant="secondary" onClick={() => window.print()}>
              <svg viewBox="0 0 20 20" className="size-5" aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinejoin="round">
                <path d="M5.5 7.5V3h9v4.5M5.5 14H3.5V8h13v6h-2M5.5 11.5h9V17h-9Z" />
              </svg>
              Print
            </Button>
          </div>
        }
      />
      <p className="mb-4 hidden text-sm text-loam-800 print:block">
        Printed {new Date().toLocaleDateString('en-US', { dateStyle: 'medium' })} · Grouped by {groupLabel.toLowerCase()}
        {filters.season ? ` · ${filters.season} season` : ' · all seasons'}
        {filters.from || filters.to ? ` · ${filters.from ?? '…'} to ${filters.to ?? '…'}` : ''}
      </p>

      <form role="search" aria-label="Forecast filters" className="mb-6 flex flex-wrap items-end gap-3 print:hidden" onSubmit={(event) => event.preventDefault()}>
        <FilterSelect
          id="forecast-group-by"
          label="Group by"
          value={filters.groupBy}
          onChange={(value) => setFilters({ groupBy: value as ForecastFilters['groupBy'] })}
          options={pageGroupBys.map((g) => ({ value: g, label: groupByLabels[g] }))}
        />
        <FilterSelect
          id="forecast-season"
          label="Season"
          value={filters.season ? String(filters.season) : ''}
          onChange={(value) => setFilters({ season: value ? Number(value) : undefined })}
          options={seasonOptions}
        />
        <div className="min-w-40">
          <label htmlFor="forecast-from" className="mb-1 block font-semibold text-ink-900">
            From month
          </label>
          <input
            id="forecast-from"
            type="month"
            className={inputClasses}
            value={filters.from ?? ''}
            max={filters.to}
            onChange={(event) => setFilters({ from: event.target.value || undefined })}
          />
        </div>
        <div className="min-w-40">
          <label htmlFor="forecast-to" className="mb-1 block font-semibold text-ink-900">
            To month
          </label>
          <input
            id="forecast-to"
            type="month"
            className={inputClasses}
            value={filters.to ?? ''}
            min={filters.from}
            onChange={(event) => setFilters({ to: event.target.value || undefined })}
          />
        </div>
        {(territories.data?.length ?? 0) > 1 && (
          <FilterSelect
            id="forecast-territory"
            label="Territory"
            value={filters.territoryId ? String(filters.territoryId) : ''}
            onChange={(value) => setFilters({ territoryId: value ? Number(value) : undefined })}
            options={[{ value: '', label: 'All territories' }, ...(territories.data ?? []).map((t) => ({ value: String(t.id), label: t.name }))]}
          />
        )}
        {user.role !== 'specialist' && (
          <FilterSelect
            id="forecast-specialist"
            label="Specialist"
            value={filters.specialistId ? String(filters.specialistId) : ''}
            onChange={(value) => setFilters({ specialistId: value ? Number(value) : undefined })}
            options={[
              { value: '', label: 'All specialists' },
              ...(specialists.data?.rows ?? []).filter((r) => r.key !== 'none').map((r) => ({ value: r.key, label: r.label })),
            ]}
          />
        )}
        <FilterSelect
          id="forecast-category"
          label="Category"
          value={filters.category ?? ''}
          onChange={(value) => setFilters({ category: value || undefined })}
          options={[{ value: '', label: 'All categories' }, ...(categories.data?.rows ?? []).map((r) => ({ value: r.key, label: r.label }))]}
        />
        {filtered && (
          <Button variant="ghost" onClick={() => clearFilters()}>
            Clear filters
          </Button>
        )}
      </form>

      <SeasonPanels filters={filters} season={focusSeason} onDrill={setDrill} />

      <section aria-labelledby="grouped-title" className="mb-8" data-grouped-forecast>
        <h2 id="grouped-title" className="mb-1 text-xl font-bold text-ink-900">
          By {groupLabel.toLowerCase()}
        </h2>
        <p className="mb-3 text-loam-700">Pipeline is every open item at full price; weighted multiplies each by its stage’s probability; actual is what is installed. Choose a bar or a row to see its items.</p>
        {result.isError ? (
          <ErrorState title="The forecast could not be loaded" message={result.error.message} onRetry={() => void result.refetch()} retrying={result.isFetching} />
        ) : (
          <>
            {rows.length > 0 && (
              <div className="mb-4 rounded-xl border border-loam-200 bg-white p-4 shadow-sm break-inside-avoid">
                <ForecastChart rows={rows} onSelect={drillRow} label={`Forecast by ${groupLabel.toLowerCase()}: pipeline, weighted and actual revenue`} />
              </div>
            )}
            <DataTable
              table={table}
              caption={`Forecast by ${groupLabel.toLowerCase()}`}
              isLoading={result.isPending}
              isRefreshing={result.isPlaceholderData}
              skeletonRows={5}
              empty={
                <EmptyState
                  title="No roadmap items match"
                  action={filtered ? <Button variant="secondary" onClick={() => clearFilters()}>Clear filters</Button> : undefined}
                >
                  {filtered ? 'Try another season, month range or filter.' : 'Items appear here once roadmaps are planned.'}
                </EmptyState>
              }
            />
            {result.data && rows.length > 0 && (
              <p className="mt-2 flex flex-wrap justify-end gap-x-6 gap-y-1 px-4 text-loam-900 tabular" data-forecast-totals>
                <span>
                  Total pipeline <strong>{formatUsd(result.data.totals.pipelineUsd)}</strong>
                </span>
                <span>
                  Weighted <strong>{formatUsd(result.data.totals.weightedUsd)}</strong>
                </span>
                <span>
                  Actual <strong>{formatUsd(result.data.totals.actualUsd)}</strong>
                </span>
                <span>
                  <strong>{result.data.totals.itemCount}</strong> items
                </span>
              </p>
            )}
          </>
        )}
      </section>

      {isManager && <QuotaPanel seasons={[focusSeason, focusSeason + 1]} canEdit />}

      <ShopCapacitySection season={focusSeason} canEdit={isManager} />

      <DrillDownDialog target={drill} onClose={() => setDrill(null)} />
    </div>
  );
}
