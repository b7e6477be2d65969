import { useQuery } from '@tanstack/react-query';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { useEffect, useState } from 'react';
import { Link } from 'react-router-dom';
import { buttonClasses } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import { Dialog } from '@/components/ui/dialog';
import { Pagination } from '@/components/ui/pagination';
import { StatusBadge, type BadgeShape, type BadgeTone } from '@/components/ui/status-badge';
import { EmptyState, ErrorState } from '@/components/ui/states';
import type { ForecastStage } from '@shared/schemas/forecast';
import { forecastExportHref, forecastItemsQueryOptions, type DrillTarget, type ForecastItem } from '../api/forecast';
import { groupByLabels } from '../api/forecast-params';
import { formatHours, formatUsd } from '../api/format';

const PAGE_SIZE = 25;

const stageBadges: Record<ForecastStage, { tone: BadgeTone; shape: BadgeShape; label: string }> = {
  idea: { tone: 'neutral', shape: 'ring', label: 'Idea' },
  proposed: { tone: 'info', shape: 'ring', label: 'Proposed' },
  quoted: { tone: 'info', shape: 'dash', label: 'Quoted' },
  accepted: { tone: 'soon', shape: 'dot', label: 'Accepted' },
  ordered: { tone: 'soon', shape: 'triangle', label: 'Ordered' },
  installed: { tone: 'good', shape: 'dot', label: 'Installed' },
  declined: { tone: 'bad', shape: 'cross', label: 'Declined' },
};

const column = createColumnHelper<ForecastItem>();

const columns = [
  column.accessor('componentName', {
    header: 'Item',
    cell: (info) => {
      const item = info.row.original;
      return (
        <div className="min-w-40">
          <span className="block font-semibold text-ink-900">{item.componentName}</span>
          <Link to={`/accounts/${item.accountId}/roadmap`} className="text-sm text-ink-700 underline decoration-ink-300 underline-offset-2 hover:decoration-ink-800">
            {item.accountName}
          </Link>
          <span className="block text-sm text-loam-700">
            {item.season} season · {item.specialistName ?? 'No specialist'}
          </span>
        </div>
      );
    },
  }),
  column.accessor('stage', {
    header: 'Stage',
    cell: (info) => {
      const badge = stageBadges[info.getValue()];
      return (
        <span className="flex flex-col items-start gap-0.5">
          <StatusBadge tone={badge.tone} shape={badge.shape}>{badge.label}</StatusBadge>
          <span className="text-sm text-loam-700 tabular">{Math.round(info.row.original.probability * 100)} %</span>
        </span>
      );
    },
  }),
  column.accessor('weightedUsd', {
    header: 'Expected',
    meta: { align: 'right' },
    cell: (info) => {
      const item = info.row.original;
      return (
        <span className="block whitespace-nowrap">
          <span className="block font-semibold">{formatUsd(item.weightedUsd)}</span>
          <span className="block text-sm text-loam-700">of {formatUsd(item.totalUsd)}</span>
          <span className="block text-sm text-loam-700">{formatHours(item.labourHours)} labour</span>
        </span>
      );
    },
  }),
];

/** The items behind one bar or row, a page at a time, with their own CSV. */
export function DrillDownDialog({ target, onClose }: { target: DrillTarget | null; onClose: () => void }) {
  const [page, setPage] = useState(1);
  useEffect(() => setPage(1), [target]);
  const items = useQuery({ ...forecastItemsQueryOptions(target ?? { filters: { groupBy: 'season' }, key: '', label: '' }, page, PAGE_SIZE), enabled: target !== null });
  const table = useReactTable({
    data: items.data?.items ?? [],
    columns,
    getRowId: (row) => String(row.id),
    getCoreRowModel: getCoreRowModel(),
    manualPagination: true,
    manualSorting: true,
    enableSorting: false,
    rowCount: items.data?.total ?? 0,
  });

  const scope = target
    ? [
        target.filters.season && target.filters.groupBy !== 'season' ? `${target.filters.season} season` : null,
        target.filters.from || target.filters.to ? `${target.filters.from ?? '…'} to ${target.filters.to ?? '…'}` : null,
      ]
        .filter(Boolean)
        .join(', ')
    : '';

  return (
    <Dialog
      open={target !== null}
      onClose={onClose}
      variant="panel"
      title={target ? `Items behind ${target.label}` : 'Items'}
      description={target ? `${groupByLabels[target.filters.groupBy]}: ${target.label}${scope ? ` · ${scope}` : ''}. Largest expected revenue first.` : undefined}
    >
      {target && (
        <div data-drill-down>
          <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
            <p className="text-loam-800 tabular">{items.data ? `${items.data.total} ${items.data.total === 1 ? 'item' : 'items'}` : ' '}</p>
            <a href={forecastExportHref(target.filters, target.key)} download className={buttonClasses('secondary')}>
              Export these items (CSV)
            </a>
          </div>
          {items.isError ? (
            <ErrorState title="The items could not be loaded" message={items.error.message} onRetry={() => void items.refetch()} retrying={items.isFetching} />
          ) : (
            <>
              <DataTable
                table={table}
                caption={`Items behind ${target.label}`}
                isLoading={items.isPending}
                isRefreshing={items.isPlaceholderData}
                skeletonRows={5}
                empty={<EmptyState title="No items here">Nothing matches these filters any more.</EmptyState>}
              />
              {items.data && items.data.total > PAGE_SIZE && (
                <Pagination page={page} pageSize={PAGE_SIZE} total={items.data.total} noun="items" onPageChange={setPage} />
              )}
            </>
          )}
        </div>
      )}
    </Dialog>
  );
}
