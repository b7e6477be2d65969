import { useQuery } from '@tanstack/react-query';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link, useLocation, useSearchParams } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { useUrlSearch } from '@/lib/use-url-search';
import { DataTable } from '@/components/ui/data-table';
import { inputClasses } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { Pagination } from '@/components/ui/pagination';
import { EmptyState, ErrorState } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { formatDateTime } from '@/features/fleet/lib/labels';
import { EmailText } from '@/features/reminders/components/email-text';
import { parseAddress } from '@/features/reminders/model/address';
import { parseSentMailParams, sentMailListQueryOptions, toSentMailParams, type SentMailFilters, type SentMailSummary } from '../api/sent-mail';

const column = createColumnHelper<SentMailSummary>();

const columns = [
  column.accessor('from', {
    header: 'From',
    enableSorting: false,
    cell: (info) => <AddressCell header={info.getValue()} fallback="—" />,
  }),
  column.accessor('to', {
    header: 'To',
    enableSorting: false,
    cell: (info) => (
      <span data-mail-to>
        <AddressCell header={info.getValue()} fallback={info.row.original.envelopeTo.join(', ')} />
      </span>
    ),
  }),
  column.accessor('subject', {
    header: 'Subject',
    enableSorting: false,
    cell: (info) => <SubjectLink mail={info.row.original} />,
  }),
  column.accessor('receivedAt', {
    header: 'Received',
    enableSorting: false,
    cell: (info) => <span className="whitespace-nowrap tabular">{formatDateTime(info.getValue())}</span>,
  }),
];

/** A display name above its address, the address wrapping before the @ when it must. */
function AddressCell({ header, fallback }: { header: string | null; fallback: string }) {
  if (!header) return <span className="text-loam-700">{fallback}</span>;
  const { name, email } = parseAddress(header);
  return (
    <span className="block min-w-40" title={header}>
      {name && <span className="block font-semibold text-ink-950">{name}</span>}
      <EmailText email={email} className={name ? 'block text-sm text-loam-700' : 'block text-ink-950'} />
    </span>
  );
}

function SubjectLink({ mail }: { mail: SentMailSummary }) {
  const location = useLocation();
  const isTest = mail.subject?.startsWith('[Test]');
  return (
    <div className="min-w-56">
      <Link
        to={`/sent-mail/${mail.id}`}
        state={{ fromList: location.search }}
        className="inline-flex min-h-11 items-center font-semibold text-ink-800 underline decoration-ink-300 underline-offset-4 hover:decoration-ink-800"
        data-mail-subject
      >
        {mail.subject ?? '(no subject)'}
      </Link>
      <div className="flex flex-wrap gap-1.5">
        {isTest && (
          <StatusBadge tone="info" shape="ring">
            Test
          </StatusBadge>
        )}
        {mail.repeatCount > 1 && (
          <span title="The same Message-ID arrived more than once (a resend after an interrupted send); the grower's mail program shows it once.">
            <StatusBadge tone="soon" shape="dash">
              Arrived {mail.repeatCount}×
            </StatusBadge>
          </span>
        )}
      </div>
    </div>
  );
}

/** Admin: the mailbox of the local SMTP stand-in — every message Rowpath handed to SMTP here. */
export function SentMailPage() {
  const [params, setParams] = useSearchParams();
  const filters = useMemo(() => parseSentMailParams(params), [params]);
  const setFilters = (patch: Partial<SentMailFilters>) => setParams((current) => toSentMailParams({ ...parseSentMailParams(current), ...patch }), { replace: true });
  // New mail arrives while the page is open (the sender works in the background).
  const mail = useQuery({ ...sentMailListQueryOptions(filters), refetchInterval: 5000 });
  const [search, setSearch] = useUrlSearch(filters.q, (q) => setFilters({ q, page: 1 }));

  const table = useReactTable({ data: mail.data?.items ?? [], columns, getRowId: (r) => String(r.id), getCoreRowModel: getCoreRowModel(), manualPagination: true, manualSorting: true });
  const total = mail.data?.total ?? 0;

  return (
    <>
      <title>Sent mail · Rowpath</title>
      <PageHeader
        title="Sent mail"
        description="What the local mail server received from Rowpath: reminders and test messages, as the growers’ mail programs would get them. A production set-up sends through the dealership’s own mail server instead."
      />
      <form
        role="search"
        aria-label="Sent mail"
        className="mb-4 flex flex-wrap items-end gap-3"
        onSubmit={(event) => {
          event.preventDefault();
          setFilters({ q: search.trim() || undefined, page: 1 });
        }}
      >
        <div className="min-w-60 flex-1 sm:max-w-md">
          <label htmlFor="sent-mail-search" className="mb-1 block font-semibold text-ink-900">
            Search
          </label>
          <input id="sent-mail-search" type="search" className={inputClasses} placeholder="Subject or recipient" value={search} onChange={(e) => setSearch(e.target.value)} autoComplete="off" />
        </div>
        {filters.q && (
          <Button variant="ghost" onClick={() => { setSearch(''); setFilters({ q: undefined, page: 1 }); }}>
            Clear search
          </Button>
        )}
      </form>
      {mail.isError ? (
        <ErrorState title="Sent mail could not be loaded" message={mail.error.message} onRetry={() => void mail.refetch()} retrying={mail.isFetching} />
      ) : (
        <>
          <DataTable
            table={table}
            caption="Messages received by the local mail server"
            isLoading={mail.isPending}
            isRefreshing={mail.isPlaceholderData}
            empty={
              filters.q ? (
                <EmptyState title={`No messages match “${filters.q}”`}>Search looks at subjects and recipients.</EmptyState>
              ) : (
                <EmptyState title="No mail yet">Messages show here once a campaign runs or a test is sent.</EmptyState>
              )
            }
          />
          {!mail.isPending && total > 0 && <Pagination page={filters.page} pageSize={filters.pageSize} total={total} noun={total === 1 ? 'message' : 'messages'} onPageChange={(page) => setFilters({ page })} />}
        </>
      )}
    </>
  );
}
