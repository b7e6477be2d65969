import { useQuery } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { Link, useLocation, useParams } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { EmptyState, ErrorState, LoadingBlock, Skeleton } from '@/components/ui/states';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { isApiError } from '@/lib/api';
import { accountDetailQueryOptions, type AccountDetail } from '../api/accounts';
import { AccountStatusBadge } from './account-status-badge';

const acresFormat = new Intl.NumberFormat('en-US', { maximumFractionDigits: 1 });

const cropLabels: Record<string, string> = {
  corn: 'Corn',
  soybean: 'Soybeans',
  sorghum: 'Sorghum',
  wheat: 'Wheat',
  sunflower: 'Sunflower',
  cotton: 'Cotton',
};

function formatCoordinate(value: number, positive: string, negative: string): string {
  return `${Math.abs(value).toFixed(4)}° ${value >= 0 ? positive : negative}`;
}

export function parseAccountId(raw: string | undefined): number | null {
  return raw && /^\d{1,9}$/.test(raw) && Number(raw) > 0 ? Number(raw) : null;
}

function BackLink() {
  const user = useCurrentUser();
  const location = useLocation();
  const fromList = (location.state as { fromList?: unknown } | null)?.fromList;
  const to = user.role === 'grower' ? '/' : `/accounts${typeof fromList === 'string' ? fromList : ''}`;
  return (
    <Link to={to} className="-ml-2 mb-2 inline-flex min-h-11 items-center gap-1 rounded px-2 font-semibold text-ink-700 hover:underline">
      <span aria-hidden="true">←</span> {user.role === 'grower' ? 'My operation' : 'All accounts'}
    </Link>
  );
}

export function AccountDetailPage() {
  const params = useParams();
  const accountId = parseAccountId(params.accountId);
  const account = useQuery({ ...accountDetailQueryOptions(accountId ?? 0), enabled: accountId !== null });

  if (accountId === null || (account.isError && isApiError(account.error) && account.error.status === 404)) {
    return (
      <>
        <title>Account not found · Rowpath</title>
        <BackLink />
        <PageHeader title="Account not found" />
        <EmptyState title="There is no account at this address that you can open">
          It may have been removed, or it belongs to a territory outside yours.
        </EmptyState>
      </>
    );
  }

  if (account.isError) {
    return (
      <>
        <BackLink />
        <PageHeader title="Account" />
        <ErrorState
          title="This account could not be loaded"
          message={account.error.message}
          onRetry={() => void account.refetch()}
          retrying={account.isFetching}
        />
      </>
    );
  }

  if (account.isPending) {
    return (
      <>
        <BackLink />
        <h1 tabIndex={-1} data-page-title className="sr-only">
          Account
        </h1>
        <Skeleton className="mb-6 h-9 w-72" />
        <LoadingBlock label="Loading the account…" />
      </>
    );
  }

  return <AccountDetailView account={account.data} />;
}

function AccountDetailView({ account }: { account: AccountDetail }) {
  const crops = Object.entries(account.acresByCrop ?? {}).filter(
    (entry): entry is [string, number] => typeof entry[1] === 'number' && entry[1] > 0,
  );
  const totalAcres = crops.reduce((sum, [, acres]) => sum + acres, 0);

  return (
    <>
      <title>{`${account.name} · Rowpath`}</title>
      <BackLink />
      <PageHeader
        title={account.name}
        description={
          <span className="inline-flex flex-wrap items-center gap-x-3 gap-y-1">
            <span>
              Account #{account.id} · {account.town}, {account.state}
            </span>
            <AccountStatusBadge status={account.status} />
          </span>
        }
      />

      <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <section aria-labelledby="account-facts" className="rounded-xl border border-loam-200 bg-white p-6 shadow-sm">
          <h2 id="account-facts" className="mb-4 text-lg font-bold text-ink-900">
            Account
          </h2>
          <dl className="grid gap-x-6 gap-y-4 sm:grid-cols-2">
            <Fact label="Status">
              <AccountStatusBadge status={account.status} />
            </Fact>
            <Fact label="Address">{account.address || <Missing />}</Fact>
            <Fact label="Town">
              {account.town}, {account.state}
            </Fact>
            <Fact label="Territory">{account.territoryName ?? <Missing text="None" />}</Fact>
            <Fact label="Specialist">{account.specialistName ?? <Missing text="Unassigned" />}</Fact>
            <Fact label="Farm location">
              {account.lat !== null && account.lng !== null ? (
                <span className="tabular">
                  {formatCoordinate(account.lat, 'N', 'S')}, {formatCoordinate(account.lng, 'E', 'W')}
                </span>
              ) : (
                <Missing />
              )}
            </Fact>
            <Fact label="Notes" className="sm:col-span-2">
              {account.notes ? <p className="whitespace-pre-line">{account.notes}</p> : <Missing text="No notes yet" />}
            </Fact>
          </dl>
        </section>

        <section aria-labelledby="account-acres" className="rounded-xl border border-loam-200 bg-white p-6 shadow-sm">
          <h2 id="account-acres" className="mb-4 text-lg font-bold text-ink-900">
            Acres by crop
          </h2>
          {crops.length === 0 ? (
            <p className="text-loam-700">No crop acres recorded yet.</p>
          ) : (
            <table className="w-full text-left">
              <caption className="sr-only">Acres by crop for {account.name}</caption>
              <thead className="text-sm text-loam-700">
                <tr>
                  <th scope="col" className="pb-2 font-semibold">
                    Crop
                  </th>
                  <th scope="col" className="pb-2 text-right font-semibold">
                    Area
                  </th>
                </tr>
              </thead>
              <tbody className="divide-y divide-loam-200">
                {crops.map(([crop, acres]) => (
                  <tr key={crop}>
                    <th scope="row" className="py-2 font-normal">
                      {cropLabels[crop] ?? crop}
                    </th>
                    <td className="py-2 text-right tabular">{acresFormat.format(acres)} ac</td>
                  </tr>
                ))}
              </tbody>
              <tfoot>
                <tr className="border-t-2 border-loam-300">
                  <th scope="row" className="pt-2 font-semibold">
                    Total
                  </th>
                  <td className="pt-2 text-right font-semibold tabular">{acresFormat.format(totalAcres)} ac</td>
                </tr>
              </tfoot>
            </table>
          )}
        </section>
      </div>

      <p className="mt-6 rounded-xl border border-dashed border-loam-400 px-6 py-4 text-loam-700">
        Planters, tractors, goals and the season-by-season upgrade roadmap for this account are not in Rowpath yet; they
        will appear on this page.
      </p>
    </>
  );
}

function Fact({ label, className, children }: { label: string; className?: string; children: ReactNode }) {
  return (
    <div className={className}>
      <dt className="text-sm font-semibold text-loam-700">{label}</dt>
      <dd className="mt-0.5 text-ink-950">{children}</dd>
    </div>
  );
}

function Missing({ text = 'Not recorded' }: { text?: string }) {
  return <span className="text-loam-700 italic">{text}</span>;
}
