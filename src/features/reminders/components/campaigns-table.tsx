import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { DataTable } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/states';
import { cropLabels, labelOf } from '@/features/fleet/lib/labels';
import type { Campaign } from '../api/reminders';
import { outboxHref } from '../api/outbox-params';
import { daysBeforeLabel, outboxStatusLooks, outboxStatusOrder } from '../model/labels';
import { formatIsoDay } from '../model/season';
import { CampaignStatusBadge, ScheduleStateBadge } from './badges';

const column = createColumnHelper<Campaign>();

// Defined once, at module level: a new array each render would rebuild the table.
const columns = [
  column.accessor('name', {
    header: 'Campaign',
    enableSorting: false,
    cell: (info) => {
      const c = info.row.original;
      return (
        <div className="min-w-44">
          <Link
            to={`/reminders/campaigns/${c.id}`}
            className="inline-flex min-h-11 items-center font-semibold text-ink-800 underline decoration-ink-300 underline-offset-4 hover:decoration-ink-800"
          >
            {c.name}
          </Link>
          <p className="text-sm text-loam-700">
            {labelOf(cropLabels, c.crop)} · {c.window?.regionLabel ?? c.regionKey} · {c.season} season
          </p>
        </div>
      );
    },
  }),
  column.accessor('status', {
    header: 'Status',
    enableSorting: false,
    cell: (info) => <CampaignStatusBadge status={info.getValue()} />,
  }),
  column.accessor('schedule', {
    header: 'Send dates',
    enableSorting: false,
    meta: { className: 'min-w-64' },
    cell: (info) => <ScheduleList campaign={info.row.original} />,
  }),
  column.accessor('outbox', {
    header: 'Outbox',
    enableSorting: false,
    cell: (info) => <OutboxCountsCell campaign={info.row.original} />,
  }),
];

function ScheduleList({ campaign }: { campaign: Campaign }) {
  if (!campaign.window) return <span className="text-brick-700">No planting window for this region and crop</span>;
  return (
    <ul className="space-y-1.5" data-schedule>
      {campaign.schedule.map((s) => (
        <li key={s.offsetDays} className="flex flex-wrap items-center gap-x-2 gap-y-0.5" data-schedule-state={s.state}>
          <span className="whitespace-nowrap">
            <span className="tabular font-semibold text-ink-950">{formatIsoDay(s.sendOn)}</span>{' '}
            <span className="text-sm text-loam-700">{daysBeforeLabel(s.offsetDays)}</span>
          </span>
          <ScheduleStateBadge state={s.state} />
        </li>
      ))}
    </ul>
  );
}

/** The outbox counts worth saying, each a link to those rows. */
export function OutboxCountsCell({ campaign }: { campaign: Pick<Campaign, 'id' | 'outbox'> }) {
  const shown = outboxStatusOrder.filter((s) => campaign.outbox[s] > 0);
  if (!shown.length) return <span className="whitespace-nowrap text-loam-700">None yet</span>;
  const parts: ReactNode[] = shown.map((status) => (
    <li key={status}>
      <Link
        to={outboxHref({ campaignId: campaign.id, status })}
        className={
          'inline-flex min-h-8 items-center underline decoration-loam-300 underline-offset-4 hover:decoration-ink-800 ' +
          (status === 'failed' ? 'font-semibold text-brick-700' : 'text-ink-900')
        }
        data-outbox-count={status}
      >
        <span className="tabular">{campaign.outbox[status]}</span>&nbsp;{outboxStatusLooks[status].label.toLowerCase()}
      </Link>
    </li>
  ));
  return <ul className="min-w-28">{parts}</ul>;
}

export function CampaignsTable({ campaigns, isLoading, isRefreshing }: { campaigns: Campaign[]; isLoading: boolean; isRefreshing: boolean }) {
  const table = useReactTable({ data: campaigns, columns, getRowId: (row) => String(row.id), getCoreRowModel: getCoreRowModel(), manualPagination: true, manualSorting: true });
  return (
    <DataTable
      table={table}
      caption="Reminder campaigns"
      isLoading={isLoading}
      isRefreshing={isRefreshing}
      skeletonRows={3}
      empty={
        <EmptyState title="No campaigns yet">
          A campaign sends reminders a set number of days before the planting window opens. Create one to start.
        </EmptyState>
      }
    />
  );
}

