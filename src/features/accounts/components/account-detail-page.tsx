import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';
import { Link, useLocation, useNavigate, useParams } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { PageHeader } from '@/components/ui/page-header';
import { EmptyState, ErrorState, LoadingBlock, Skeleton } from '@/components/ui/states';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { AttachmentsBlock } from '@/features/fleet/components/attachments-block';
import { ConfirmDeleteDialog } from '@/features/fleet/components/confirm-delete-dialog';
import { ContactsSection } from '@/features/fleet/components/contacts-section';
import { FarmSitesSection } from '@/features/fleet/components/farm-sites-section';
import { Notice } from '@/features/fleet/components/form-bits';
import { FleetSection, Missing } from '@/features/fleet/components/section';
import { TractorsSection } from '@/features/fleet/components/tractors-section';
import { cropLabels, formatCoordinate, formatDateTime, formatNumber, labelOf } from '@/features/fleet/lib/labels';
import { PlantersSection } from '@/features/planters/components/planters-section';
import { isApiError } from '@/lib/api';
import { accountDetailQueryOptions, accountKeys, type AccountDetail } from '../api/accounts';
import { useDeleteAccountMutation, useUpdateAccountMutation } from '../api/update-account';
import { AccountForm } from './account-form';
import { AccountStatusBadge } from './account-status-badge';
import { AuditTrail } from './audit-trail';

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
        <ErrorState title="This account could not be loaded" message={account.error.message} onRetry={() => void account.refetch()} retrying={account.isFetching} />
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

  return <AccountFleetView account={account.data} />;
}

const jumpLinks = [
  ['planters', 'Planters'],
  ['tractors', 'Tractors'],
  ['farm-sites', 'Farm sites'],
  ['contacts', 'Contacts'],
  ['files', 'Photos and documents'],
  ['details', 'Account details'],
  ['changes', 'Record of changes'],
] as const;

/**
 * The account's fleet page: who the grower is and what they grow at the top; then planters first
 * (the reason a specialist opens the page), their tractors and yards, the people, the files, and
 * the record of every change. Staff add and edit in place; growers read the same page.
 */
function AccountFleetView({ account }: { account: AccountDetail }) {
  const user = useCurrentUser();
  const canEdit = user.role !== 'grower';
  const canDelete = user.role === 'admin' || user.role === 'manager';
  const [editing, setEditing] = useState(false);
  const [deleting, setDeleting] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const update = useUpdateAccountMutation();
  const remove = useDeleteAccountMutation();
  const queryClient = useQueryClient();
  const navigate = useNavigate();

  const crops = Object.entries(account.acresByCrop ?? {}).filter((e): e is [string, number] => typeof e[1] === 'number' && e[1] > 0);
  const totalAcres = crops.reduce((sum, [, acres]) => sum + acres, 0);
  const place = [account.town, account.state].filter(Boolean).join(', ');

  return (
    <>
      <title>{`${account.name} · Rowpath`}</title>
      <BackLink />
      <PageHeader
        title={account.name}
        description={
          <span className="inline-flex flex-wrap items-center gap-x-3 gap-y-1">
            <AccountStatusBadge status={account.status} />
            <span>Account #{account.id}</span>
            {place && <span>{place}</span>}
          </span>
        }
        actions={
          canEdit && (
            <>
              <Link to={`/accounts/${account.id}/roadmap`} className="inline-flex min-h-11 items-center justify-center rounded-lg bg-ink-800 px-4 py-2 font-semibold text-white hover:bg-ink-700">
                Upgrade roadmap
              </Link>
              <Button variant="secondary" onClick={() => setEditing(true)}>
                Edit account details
              </Button>
              {canDelete && (
                <Button variant="ghost" className="text-brick-700 hover:bg-brick-50" onClick={() => setDeleting(true)}>
                  Delete account
                </Button>
              )}
            </>
          )
        }
      />

      <div className="mb-6 grid gap-4 rounded-xl border border-loam-200 bg-white p-5 shadow-sm sm:grid-cols-[repeat(2,minmax(0,1fr))] lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)_minmax(0,2fr)]">
        <HeaderFact label="Territory">{account.territoryName ?? <Missing text="None" />}</HeaderFact>
        <HeaderFact label="Planting specialist">{account.specialistName ?? <Missing text="Unassigned" />}</HeaderFact>
        <HeaderFact label="Acres by crop">
          {crops.length === 0 ? (
            <Missing text="No crop acres recorded" />
          ) : (
            <ul className="flex flex-wrap gap-2" aria-label="Acres by crop">
              {crops.map(([crop, acres]) => (
                <li key={crop} className="rounded-lg bg-loam-100 px-2.5 py-1 tabular">
                  <span className="text-loam-800">{labelOf(cropLabels, crop)}</span> <span className="font-semibold text-ink-950">{formatNumber(acres)} ac</span>
                </li>
              ))}
              <li className="rounded-lg border border-loam-300 px-2.5 py-1 tabular">
                <span className="text-loam-800">In all</span> <span className="font-bold text-ink-950">{formatNumber(totalAcres)} ac</span>
              </li>
            </ul>
          )}
        </HeaderFact>
      </div>

      <nav aria-label="On this page" className="mb-6">
        <ul className="flex flex-wrap gap-2">
          {jumpLinks.map(([id, label]) => (
            <li key={id}>
              <a href={`#${id}`} className="inline-flex min-h-11 items-center rounded-full border border-loam-300 bg-white px-4 font-semibold text-ink-800 hover:border-ink-400 hover:bg-ink-50">
                {label}
              </a>
            </li>
          ))}
        </ul>
      </nav>

      <Notice message={notice} onDone={() => setNotice(null)} className="mb-4" />

      <div className="grid items-start gap-6 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <div className="space-y-6">
          <PlantersSection accountId={account.id} planters={account.planters} tractors={account.tractors} farmSites={account.farmSites} canEdit={canEdit} />
          <TractorsSection accountId={account.id} tractors={account.tractors} canEdit={canEdit} />
          <FarmSitesSection accountId={account.id} sites={account.farmSites} canEdit={canEdit} />
        </div>
        <div className="space-y-6">
          <ContactsSection accountId={account.id} contacts={account.contacts} canEdit={canEdit} />
          <FleetSection id="files" title="Photos and documents">
            <AttachmentsBlock accountId={account.id} ownerType="account" ownerId={account.id} ownerLabel={account.name} canEdit={canEdit} hideHeading />
          </FleetSection>
          <FleetSection id="details" title="Account details">
            <dl className="grid gap-x-6 gap-y-3 sm:grid-cols-2">
              <Fact label="Address">{account.address || <Missing />}</Fact>
              <Fact label="Town">{place || <Missing />}</Fact>
              <Fact label="Farm office">
                {account.lat !== null && account.lng !== null ? (
                  <span className="tabular">
                    {formatCoordinate(account.lat, 'N', 'S')}, {formatCoordinate(account.lng, 'E', 'W')}
                  </span>
                ) : (
                  <Missing />
                )}
              </Fact>
              <Fact label="Last changed">{account.updatedAt ? formatDateTime(account.updatedAt) : <Missing />}</Fact>
              <Fact label="Notes" className="sm:col-span-2">
                {account.notes ? <p className="whitespace-pre-line">{account.notes}</p> : <Missing text="No notes yet" />}
              </Fact>
            </dl>
          </FleetSection>
        </div>
      </div>

      <div className="mt-6">
        <AuditTrail accountId={account.id} />
      </div>

      <Dialog open={editing} onClose={() => setEditing(false)} variant="panel" title={`Edit ${account.name}`}>
        {editing && (
          <AccountForm
            key={account.version}
            account={account}
            busy={update.isPending}
            onCancel={() => setEditing(false)}
            onReload={() => void queryClient.invalidateQueries({ queryKey: accountKeys.detail(account.id) })}
            onSubmit={(input, handleError) =>
              update.mutate(
                { id: account.id, changes: { ...input, version: account.version } },
                {
                  onSuccess: () => {
                    setEditing(false);
                    setNotice('The account details were saved.');
                  },
                  onError: handleError,
                },
              )
            }
          />
        )}
      </Dialog>
      <ConfirmDeleteDialog
        what={deleting ? account.name : null}
        title={`Delete ${account.name}?`}
        confirmLabel="Delete the account and its fleet"
        onConfirm={() => remove.mutateAsync(account.id)}
        onDeleted={() => navigate('/accounts', { replace: true })}
        onClose={() => setDeleting(false)}
      >
        {`This deletes ${account.name} with its contacts, farm sites, tractors, planters and every install record. Grower sign-ins linked to it are disabled. It cannot be undone.`}
      </ConfirmDeleteDialog>
    </>
  );
}

function HeaderFact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div>
      <p className="text-sm font-semibold text-loam-700">{label}</p>
      <div className="mt-1 text-lg text-ink-950">{children}</div>
    </div>
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
