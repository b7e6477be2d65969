import { useQuery } from '@tanstack/react-query';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { createContext, use, useMemo, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { OutboxStatus } from '@shared/schemas/reminders';
import { Button } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import { Dialog } from '@/components/ui/dialog';
import { ErrorMark, FormAlert, inputClasses } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { Pagination } from '@/components/ui/pagination';
import { EmptyState, ErrorState, LoadingBlock } from '@/components/ui/states';
import { Notice } from '@/features/fleet/components/form-bits';
import { formatDateTime } from '@/features/fleet/lib/labels';
import { cn } from '@/lib/cn';
import { parseOutboxParams, toOutboxParams } from '../api/outbox-params';
import { CAMPAIGN_LIST, campaignListQueryOptions, messagesInFlight, outboxMessageQueryOptions, outboxQueryOptions, type OutboxFilters, type OutboxMessage } from '../api/reminders';
import { useRetryMessageMutation } from '../api/retry-message';
import { daysBeforeLabel, outboxStatusLooks, outboxStatusOrder } from '../model/labels';
import { formatIsoDay } from '../model/season';
import { OutboxStatusBadge } from './badges';
import { EmailText } from './email-text';
import { MailView } from './mail-view';
import { RemindersNav } from './reminders-nav';

interface RowActions {
  retry: (message: OutboxMessage) => void;
  retryingId: number | null;
  open: (message: OutboxMessage) => void;
}
const RowActionsContext = createContext<RowActions | null>(null);

const column = createColumnHelper<OutboxMessage>();

// Sent and retry times this season: the year goes without saying in a busy table.
const shortTime = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', hour: 'numeric', minute: '2-digit' });
const formatShortTime = (iso: string) => shortTime.format(new Date(iso));

const columns = [
  column.accessor('contactName', {
    header: 'Grower',
    enableSorting: false,
    cell: (info) => {
      const m = info.row.original;
      return (
        <div className="min-w-40">
          <span className="block font-semibold text-ink-950">{m.contactName}</span>
          <span className="block text-sm text-loam-800">{m.accountName}</span>
          <EmailText email={m.toEmail} className="block text-sm text-loam-700" />
        </div>
      );
    },
  }),
  column.accessor('campaignName', {
    header: 'Reminder',
    enableSorting: false,
    cell: (info) => {
      const m = info.row.original;
      return (
        <div className="min-w-36">
          <span className="block text-ink-950">{m.campaignName}</span>
          <span className="block text-sm text-loam-700">
            {daysBeforeLabel(m.offsetDays)} · due {formatIsoDay(m.sendOn)}
          </span>
        </div>
      );
    },
  }),
  column.accessor('status', {
    header: 'Status',
    enableSorting: false,
    cell: (info) => {
      const m = info.row.original;
      return (
        <div className="whitespace-nowrap">
          <OutboxStatusBadge status={m.status} />
          {m.sentAt && <span className="mt-1 block text-sm text-loam-700 tabular" title={formatDateTime(m.sentAt)}>{formatShortTime(m.sentAt)}</span>}
        </div>
      );
    },
  }),
  column.accessor('attempts', {
    header: 'Attempts',
    enableSorting: false,
    cell: (info) => {
      const m = info.row.original;
      return (
        <div className="whitespace-nowrap">
          <span className="tabular" data-attempts>{m.attempts}</span>
          {m.nextAttemptAt && <span className="block text-sm text-loam-700 tabular" title={formatDateTime(m.nextAttemptAt)}>next {formatShortTime(m.nextAttemptAt)}</span>}
        </div>
      );
    },
  }),
  column.accessor('lastError', {
    header: 'Last error',
    enableSorting: false,
    meta: { className: 'min-w-44' },
    cell: (info) => <LastError message={info.row.original} />,
  }),
  column.display({
    id: 'actions',
    header: () => <span className="sr-only">Actions</span>,
    cell: (info) => <RowButtons message={info.row.original} />,
  }),
];

function LastError({ message }: { message: OutboxMessage }) {
  if (!message.lastError) return <span className="text-loam-600">—</span>;
  const failed = message.status === 'failed';
  return (
    <p className={cn('flex items-start gap-1.5 text-sm', failed ? 'font-semibold text-brick-700' : 'text-loam-800')} data-last-error>
      {failed && <ErrorMark />}
      <span>{message.lastError}</span>
    </p>
  );
}

function RowButtons({ message }: { message: OutboxMessage }) {
  const actions = use(RowActionsContext)!;
  return (
    <div className="flex flex-col items-end gap-1">
      <Button variant="ghost" className="px-3" onClick={() => actions.open(message)} aria-label={`Read the message to ${message.contactName}`}>
        Read
      </Button>
      {message.status === 'failed' && (
        <Button variant="secondary" className="px-3 whitespace-nowrap" busy={actions.retryingId === message.id} onClick={() => actions.retry(message)} aria-label={`Send again to ${message.contactName}`}>
          Send again
        </Button>
      )}
    </div>
  );
}

/** Staff: every reminder message, its state and its last error; failed ones can be sent again. */
export function OutboxPage() {
  const [params, setParams] = useSearchParams();
  const filters = useMemo(() => parseOutboxParams(params), [params]);
  const setFilters = (patch: Partial<OutboxFilters>) => setParams((current) => toOutboxParams({ ...parseOutboxParams(current), ...patch }));
  const outbox = useQuery({
    ...outboxQueryOptions(filters),
    // Follow the sender while messages are on their way.
    refetchInterval: (query) => (messagesInFlight(query.state.data?.counts) > 0 ? 3000 : false),
  });
  const campaigns = useQuery(campaignListQueryOptions(CAMPAIGN_LIST));
  const retry = useRetryMessageMutation();
  const [reading, setReading] = useState<OutboxMessage | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [retryError, setRetryError] = useState<string | null>(null);

  const actions: RowActions = {
    retryingId: retry.isPending ? (retry.variables ?? null) : null,
    open: setReading,
    retry: (message) => {
      setRetryError(null);
      retry.mutate(message.id, {
        onSuccess: () => setNotice(`The message to ${message.contactName} is pending again; the sender tries it shortly.`),
        onError: (error) => setRetryError(error.message),
      });
    },
  };

  const table = useReactTable({
    data: outbox.data?.items ?? [],
    columns,
    getRowId: (row) => String(row.id),
    getCoreRowModel: getCoreRowModel(),
    manualPagination: true,
    manualSorting: true,
  });
  const counts = outbox.data?.counts;
  const all = counts ? Object.values(counts).reduce((a, b) => a + b, 0) : 0;
  const campaignName = campaigns.data?.items.find((c) => c.id === filters.campaignId)?.name;

  return (
    <RowActionsContext value={actions}>
      <title>Outbox · Reminders · Rowpath</title>
      <PageHeader title="Pre-season reminders" description="Every reminder message: waiting, on its way, sent, or failed with the reason." />
      <RemindersNav />
      <div className="mb-4 flex flex-wrap items-end gap-4">
        <div className="min-w-64">
          <label htmlFor="outbox-campaign" className="mb-1 block font-semibold text-ink-900">
            Campaign
          </label>
          <select id="outbox-campaign" className={inputClasses} value={filters.campaignId ?? ''} onChange={(e) => setFilters({ campaignId: e.target.value ? Number(e.target.value) : undefined, page: 1 })}>
            <option value="">All campaigns</option>
            {campaigns.data?.items.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name}
              </option>
            ))}
          </select>
        </div>
        {messagesInFlight(counts) > 0 && (
          <p className="flex min-h-11 items-center gap-2 text-loam-800" role="status">
            <span className="inline-block size-2.5 animate-pulse rounded-full bg-ink-500" aria-hidden="true" />
            {messagesInFlight(counts)} on the way; this list follows the sender.
          </p>
        )}
      </div>
      <div role="group" aria-label="Show messages by status" className="mb-4 flex flex-wrap gap-2" data-status-filter>
        <StatusChip label="All" count={all} active={!filters.status} onClick={() => setFilters({ status: undefined, page: 1 })} />
        {outboxStatusOrder.map((s) => (
          <StatusChip key={s} status={s} label={outboxStatusLooks[s].label} count={counts?.[s] ?? 0} active={filters.status === s} onClick={() => setFilters({ status: s, page: 1 })} />
        ))}
      </div>
      <Notice message={notice} onDone={() => setNotice(null)} className="mb-3" />
      {retryError && (
        <div className="mb-3">
          <FormAlert>{retryError}</FormAlert>
        </div>
      )}
      {(counts?.failed ?? 0) > 0 && filters.status !== 'failed' && (
        <div className="mb-4">
          <FormAlert>
            <p className="font-semibold">
              {counts!.failed} {counts!.failed === 1 ? 'message' : 'messages'} could not be delivered.{' '}
              <button type="button" className="underline underline-offset-4" onClick={() => setFilters({ status: 'failed', page: 1 })}>
                Show the failed ones
              </button>
            </p>
          </FormAlert>
        </div>
      )}
      {outbox.isError ? (
        <ErrorState title="The outbox could not be loaded" message={outbox.error.message} onRetry={() => void outbox.refetch()} retrying={outbox.isFetching} />
      ) : (
        <>
          <DataTable
            table={table}
            caption={`Reminder messages${filters.status ? `, ${outboxStatusLooks[filters.status].label.toLowerCase()}` : ''}${campaignName ? `, ${campaignName}` : ''}`}
            isLoading={outbox.isPending}
            isRefreshing={outbox.isPlaceholderData}
            empty={
              <EmptyState title={filters.status ? `No ${outboxStatusLooks[filters.status].label.toLowerCase()} messages` : 'The outbox is empty'}>
                {filters.status || filters.campaignId ? 'Try another status or campaign.' : 'Messages appear here when a campaign runs: by itself on its days, or with Run now.'}
              </EmptyState>
            }
          />
          {!outbox.isPending && (outbox.data?.total ?? 0) > 0 && (
            <Pagination page={filters.page} pageSize={filters.pageSize} total={outbox.data!.total} noun={outbox.data!.total === 1 ? 'message' : 'messages'} onPageChange={(page) => setFilters({ page })} />
          )}
        </>
      )}
      <MessageDialog message={reading} onClose={() => setReading(null)} />
    </RowActionsContext>
  );
}

function StatusChip({ label, count, active, onClick, status }: { label: string; count: number; active: boolean; onClick: () => void; status?: OutboxStatus }) {
  return (
    <button
      type="button"
      aria-pressed={active}
      onClick={onClick}
      data-status-chip={status ?? 'all'}
      className={cn(
        'inline-flex min-h-11 items-center gap-2 rounded-full border px-4 font-semibold',
        active ? 'border-ink-800 bg-ink-800 text-white' : 'border-loam-400 bg-white text-ink-900 hover:bg-loam-100',
        !active && status === 'failed' && count > 0 && 'border-brick-500 text-brick-700',
      )}
    >
      {label}
      <span className={cn('rounded-full px-2 text-sm tabular', active ? 'bg-ink-600' : 'bg-loam-100')}>{count}</span>
    </button>
  );
}

function MessageDialog({ message, onClose }: { message: OutboxMessage | null; onClose: () => void }) {
  const detail = useQuery({ ...outboxMessageQueryOptions(message?.id ?? 0), enabled: message !== null });
  return (
    <Dialog open={message !== null} onClose={onClose} variant="panel" title={message ? message.subject : 'Message'} description={message ? `To ${message.contactName} <${message.toEmail}>` : undefined}>
      {message &&
        (detail.isPending ? (
          <LoadingBlock label="Loading the message…" />
        ) : detail.isError ? (
          <FormAlert>{detail.error.message}</FormAlert>
        ) : (
          <div className="space-y-4">
            <p className="flex flex-wrap items-center gap-2">
              <OutboxStatusBadge status={detail.data.status} />
              <span className="text-loam-800">
                {detail.data.campaignName}, {daysBeforeLabel(detail.data.offsetDays)}; {detail.data.attempts} {detail.data.attempts === 1 ? 'attempt' : 'attempts'}
              </span>
            </p>
            {detail.data.lastError && <FormAlert tone={detail.data.status === 'failed' ? 'error' : 'warning'}>{detail.data.lastError}</FormAlert>}
            <MailView html={detail.data.html ?? null} text={detail.data.text ?? null} title={`Message to ${detail.data.contactName}`} frameHeight={560} />
          </div>
        ))}
    </Dialog>
  );
}
