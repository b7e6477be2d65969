import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import type { ComponentCategory } from '@shared/schemas/fleet';
import { workingWidthFt } from '@shared/calc/sizing';
import { Button, ButtonLink } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { PageHeader } from '@/components/ui/page-header';
import { EmptyState, ErrorState, LoadingBlock, Skeleton } from '@/components/ui/states';
import { accountDetailQueryOptions } from '@/features/accounts/api/accounts';
import { useCurrentUser } from '@/features/auth/components/current-user';
import type { PlanterDetail } from '@/features/fleet/api/types';
import { AttachmentsBlock } from '@/features/fleet/components/attachments-block';
import { GlyphIcon } from '@/features/fleet/components/component-glyph';
import { ConfirmDeleteDialog } from '@/features/fleet/components/confirm-delete-dialog';
import { Notice } from '@/features/fleet/components/form-bits';
import { FactList, FleetSection } from '@/features/fleet/components/section';
import { categoryLabels, categoryOrder, foldTypeLabels, formatNumber, frameTypeLabels, labelOf, seedSupplyLabels } from '@/features/fleet/lib/labels';
import { isApiError } from '@/lib/api';
import { planterDetailQueryOptions, planterKeys } from '../api/planters';
import { useDeletePlanterMutation, useSavePlanterMutation } from '../api/save-planter';
import { formatRowRange, installsOnPlanter, rowSetups } from '../lib/planter-layout';
import { InstallHistory } from './install-history';
import { PartsPanel } from './parts-panel';
import { PlanterDrawing, type PanelTarget } from './planter-drawing';
import { PlanterForm } from './planter-form';

export function parsePlanterId(raw: string | undefined): number | null {
  return raw && /^\d{1,9}$/.test(raw) && Number(raw) > 0 ? Number(raw) : null;
}

export function PlanterPage() {
  const params = useParams();
  const id = parsePlanterId(params.planterId);
  const planter = useQuery({ ...planterDetailQueryOptions(id ?? 0), enabled: id !== null });

  if (id === null || (planter.isError && isApiError(planter.error) && planter.error.status === 404)) {
    return (
      <>
        <title>Planter not found · Rowpath</title>
        <PageHeader title="Planter not found" />
        <EmptyState title="There is no planter at this address that you can open">It may have been removed, or it belongs to an account outside yours.</EmptyState>
      </>
    );
  }
  if (planter.isError) {
    return (
      <>
        <PageHeader title="Planter" />
        <ErrorState title="This planter could not be loaded" message={planter.error.message} onRetry={() => void planter.refetch()} retrying={planter.isFetching} />
      </>
    );
  }
  if (planter.isPending) {
    return (
      <>
        <h1 tabIndex={-1} data-page-title className="sr-only">
          Planter
        </h1>
        <Skeleton className="mb-6 h-9 w-72" />
        <LoadingBlock label="Loading the planter…" />
      </>
    );
  }
  return <PlanterView planter={planter.data} />;
}

function PlanterView({ planter }: { planter: PlanterDetail }) {
  const user = useCurrentUser();
  const canEdit = user.role !== 'grower';
  const [target, setTarget] = useState<PanelTarget | null>(null);
  const [editing, setEditing] = useState(false);
  const [deleting, setDeleting] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const account = useQuery(accountDetailQueryOptions(planter.accountId));
  const save = useSavePlanterMutation();
  const remove = useDeletePlanterMutation();
  const queryClient = useQueryClient();
  const navigate = useNavigate();

  const widthFt = workingWidthFt(planter.rows, planter.rowSpacingIn);
  const installedNow = planter.installs.filter((i) => i.status === 'installed');
  const planterParts = installsOnPlanter(planter.installs);
  const setups = rowSetups(planter.rows, planter.installs);
  const site = account.data?.farmSites.find((s) => s.id === planter.farmSiteId);
  const present = new Set<ComponentCategory>(installedNow.map((i) => i.component?.category ?? 'other'));
  const legend = categoryOrder.filter((c) => present.has(c));

  return (
    <>
      <title>{`${planter.name} · ${planter.accountName} · Rowpath`}</title>
      <Link to={`/accounts/${planter.accountId}`} className="-ml-2 mb-2 inline-flex min-h-11 items-center gap-1 rounded px-2 font-semibold text-ink-700 hover:underline">
        <span aria-hidden="true">←</span> {planter.accountName}
      </Link>
      <PageHeader
        title={planter.name}
        description={
          <span className="tabular">
            <strong className="text-ink-900">
              {planter.rows} rows × {formatNumber(planter.rowSpacingIn)} in
            </strong>{' '}
            · {formatNumber(widthFt)} ft working width · {[planter.maker, planter.modelYear].filter(Boolean).join(' ') || 'Maker not recorded'}
          </span>
        }
        actions={
          <>
            <ButtonLink to={`/planters/${planter.id}/sizing`} variant="secondary">
              Sizing
            </ButtonLink>
            {canEdit && (
              <>
                <Button variant="secondary" onClick={() => setEditing(true)}>
                  Edit planter
                </Button>
                <Button onClick={() => setTarget({ kind: 'add' })}>
                  <span aria-hidden="true">+</span> Add a component
                </Button>
              </>
            )}
          </>
        }
      />

      <div className="mb-6 rounded-xl border border-loam-200 bg-white px-5 py-4 shadow-sm">
        <FactList
          items={[
            { label: 'Frame', value: labelOf(frameTypeLabels, planter.frameType) },
            { label: 'Fold', value: labelOf(foldTypeLabels, planter.foldType) },
            { label: 'Seed', value: `${labelOf(seedSupplyLabels, planter.seedSupplyType)}${planter.seedCapacityUnits !== null ? `, ${formatNumber(planter.seedCapacityUnits)} units` : ''}` },
            { label: 'Liquid', value: planter.liquidTankCount > 0 ? `${planter.liquidTankCount} × ${formatNumber(planter.liquidTankGallons)} gal` : 'none' },
            { label: 'Dry fertilizer', value: planter.dryCapacityLb > 0 ? `${formatNumber(planter.dryCapacityLb)} lb` : 'none' },
            { label: 'Markers', value: planter.markers ? 'yes' : 'no' },
            planter.acresPerYear !== null && { label: 'Plants', value: `${formatNumber(planter.acresPerYear)} ac a year` },
            {
              label: 'Pulled by',
              value: planter.tractor ? `${planter.tractor.name} (${formatNumber(planter.tractor.hydraulicFlowGpm)} gpm at ${formatNumber(planter.tractor.hydraulicPressurePsi)} psi)` : 'not recorded',
            },
            site ? { label: 'Kept at', value: site.name } : false,
          ]}
        />
      </div>

      <Notice message={notice} onDone={() => setNotice(null)} className="mb-4" />

      <div className="space-y-6">
        <figure className="min-w-0 rounded-xl border border-loam-200 bg-white p-4 shadow-sm sm:p-5" aria-labelledby="drawing-caption">
          <figcaption id="drawing-caption" className="mb-3">
            <span className="block text-xl font-bold text-ink-900">The planter, row by row</span>
            <span className="block text-loam-700">
              Seen from above, hitch at the top. {canEdit ? 'Choose a row unit or a toolbar to see and change its parts.' : 'Choose a row unit or a toolbar to see its parts.'}
            </span>
          </figcaption>
          <PlanterDrawing planter={planter} selected={target} onSelect={setTarget} />
          {legend.length > 0 && (
            <div className="mt-3 border-t border-loam-200 pt-3">
              <p className="mb-1 text-sm font-semibold text-loam-800">Key</p>
              <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
                {legend.map((c) => (
                  <li key={c} className="inline-flex items-center gap-1.5">
                    <GlyphIcon category={c} size={18} />
                    {categoryLabels[c]}
                  </li>
                ))}
              </ul>
            </div>
          )}
        </figure>

        <div className="grid items-start gap-6 lg:grid-cols-2">
          <Side title="On the whole planter" id="planter-parts">
            {planterParts.length === 0 ? (
              <p className="text-loam-700">No planter-level parts (display, vacuum fan, pump…) recorded.</p>
            ) : (
              <ul className="space-y-2">
                {planterParts.map((i) => (
                  <li key={i.id} className="flex items-center gap-2">
                    {i.component && <GlyphIcon category={i.component.category} size={20} />}
                    <span>{i.component?.name}</span>
                  </li>
                ))}
              </ul>
            )}
            <Button variant="secondary" className="mt-3" onClick={() => setTarget({ kind: 'planter' })}>
              {canEdit ? 'Open whole-planter parts' : 'Details of planter parts'}
            </Button>
          </Side>
          <Side title="Row set-ups" id="row-setups">
            <ul className="space-y-2">
              {setups.map((s) => (
                <li key={s.fromRow}>
                  <button type="button" className="text-left font-semibold text-ink-800 underline underline-offset-2" onClick={() => setTarget({ kind: 'row', row: s.fromRow })}>
                    {formatRowRange(s.fromRow, s.toRow).replace(/^r/, 'R')}
                  </button>
                  <span className="block text-loam-800">{s.names.length ? s.names.join('; ') : 'nothing installed'}</span>
                </li>
              ))}
            </ul>
          </Side>
        </div>
      </div>

      <div className="mt-6 grid items-start gap-6 xl:grid-cols-2">
        <FleetSection id="history" title="Install history" count={planter.installs.length} description="Every part fitted and removed, newest first.">
          <InstallHistory planter={planter} />
        </FleetSection>
        <FleetSection id="planter-files" title="Photos and documents">
          <AttachmentsBlock accountId={planter.accountId} ownerType="planter" ownerId={planter.id} ownerLabel={planter.name} canEdit={canEdit} hideHeading />
        </FleetSection>
      </div>

      {canEdit && (
        <div className="mt-6 flex justify-end">
          <Button variant="ghost" className="text-brick-700 hover:bg-brick-50" onClick={() => setDeleting(true)}>
            Delete this planter
          </Button>
        </div>
      )}

      <PartsPanel planter={planter} target={target} canEdit={canEdit} onClose={() => setTarget(null)} onTarget={setTarget} />

      <Dialog open={editing} onClose={() => setEditing(false)} variant="panel" title={`Edit ${planter.name}`}>
        {editing &&
          (account.isPending ? (
            <LoadingBlock label="Loading the account's tractors and farm sites…" />
          ) : (
            <PlanterForm
              key={planter.version}
              planter={planter}
              tractors={account.data?.tractors ?? (planter.tractor ? [planter.tractor] : [])}
              farmSites={account.data?.farmSites ?? []}
              busy={save.isPending}
              onCancel={() => setEditing(false)}
              onReload={() => void queryClient.invalidateQueries({ queryKey: planterKeys.detail(planter.id) })}
              onSubmit={(input, handleError) =>
                save.mutate(
                  { mode: 'update', id: planter.id, input, version: planter.version },
                  {
                    onSuccess: () => {
                      setEditing(false);
                      setNotice('The planter was saved.');
                    },
                    onError: handleError,
                  },
                )
              }
            />
          ))}
      </Dialog>
      <ConfirmDeleteDialog
        what={deleting ? planter.name : null}
        title={`Delete ${planter.name}?`}
        confirmLabel="Delete the planter"
        onConfirm={() => remove.mutateAsync({ id: planter.id, accountId: planter.accountId })}
        onDeleted={() => navigate(`/accounts/${planter.accountId}`, { replace: true })}
        onClose={() => setDeleting(false)}
      >
        {`This deletes ${planter.name} with its toolbars and all ${planter.installs.length} install records. It cannot be undone.`}
      </ConfirmDeleteDialog>
    </>
  );
}

function Side({ title, id, children }: { title: string; id: string; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className="rounded-xl border border-loam-200 bg-white p-5 shadow-sm">
      <h2 id={id} className="mb-3 text-lg font-bold text-ink-900">
        {title}
      </h2>
      {children}
    </section>
  );
}
