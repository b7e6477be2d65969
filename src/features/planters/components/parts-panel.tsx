import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { StatusBadge } from '@/components/ui/status-badge';
import type { Install, PlanterDetail } from '@/features/fleet/api/types';
import { AttachmentsBlock } from '@/features/fleet/components/attachments-block';
import { GlyphIcon } from '@/features/fleet/components/component-glyph';
import { ConfirmDeleteDialog } from '@/features/fleet/components/confirm-delete-dialog';
import { Notice } from '@/features/fleet/components/form-bits';
import { categoryLabels, formatDate, formatUsd } from '@/features/fleet/lib/labels';
import { useDeleteInstallMutation } from '../api/installs';
import { planterKeys } from '../api/planters';
import { byRowUnitOrder, coversRow, formatRowRange, installsOnPlanter, installsOnRow, installsOnToolbar, placementText } from '../lib/planter-layout';
import { InstallForm, RemoveInstallForm } from './install-form';
import type { PanelTarget } from './planter-drawing';

type Mode = { kind: 'list' } | { kind: 'add' } | { kind: 'edit'; installId: number } | { kind: 'remove'; installId: number };

interface PartsPanelProps {
  planter: PlanterDetail;
  target: PanelTarget | null;
  canEdit: boolean;
  onClose: () => void;
  onTarget: (target: PanelTarget) => void;
}

function titleFor(planter: PlanterDetail, target: PanelTarget): string {
  switch (target.kind) {
    case 'row':
      return `Row ${target.row}`;
    case 'toolbar': {
      const t = planter.toolbars.find((x) => x.id === target.toolbarId);
      return t ? `${t.name} · ${t.sizeFt} ft` : 'Toolbar';
    }
    case 'planter':
      return 'The whole planter';
    default:
      return 'Add a component';
  }
}

/**
 * The side panel for one row unit, one toolbar or the whole planter: what is on it now (each with
 * its date, price, serials, work order and photos), what was removed from it, and for staff the
 * forms to add a part, change a record, mark a part removed or erase a record made in error.
 */
export function PartsPanel({ planter, target, canEdit, onClose, onTarget }: PartsPanelProps) {
  return (
    <Dialog
      open={target !== null}
      onClose={onClose}
      variant="panel"
      title={target ? titleFor(planter, target) : ''}
      description={target ? describe(planter, target) : undefined}
    >
      {target && <PanelBody key={JSON.stringify(target)} planter={planter} target={target} canEdit={canEdit} onClose={onClose} onTarget={onTarget} />}
    </Dialog>
  );
}

function describe(planter: PlanterDetail, target: PanelTarget): string {
  if (target.kind === 'row') {
    const bar = [...planter.toolbars].sort((a, b) => a.position - b.position).find((t) => target.row >= t.firstRow && target.row <= t.lastRow);
    return `${planter.name}${bar ? `, on the ${bar.name}` : ''}`;
  }
  if (target.kind === 'toolbar') {
    const t = planter.toolbars.find((x) => x.id === target.toolbarId);
    return t ? `${planter.name}, carries ${formatRowRange(t.firstRow, t.lastRow)}` : planter.name;
  }
  if (target.kind === 'planter') return `${planter.name}: parts fitted once per planter`;
  return `${planter.name}: a part on every row, a range of rows, a toolbar or the planter`;
}

function PanelBody({ planter, target, canEdit, onClose, onTarget }: { planter: PlanterDetail; target: PanelTarget; canEdit: boolean; onClose: () => void; onTarget: (t: PanelTarget) => void }) {
  const [mode, setMode] = useState<Mode>(target.kind === 'add' ? { kind: 'add' } : { kind: 'list' });
  const [notice, setNotice] = useState<string | null>(null);
  const [deleting, setDeleting] = useState<Install | null>(null);
  const remove = useDeleteInstallMutation(planter.id, planter.accountId);
  const queryClient = useQueryClient();
  const reload = () => void queryClient.invalidateQueries({ queryKey: planterKeys.detail(planter.id) });

  const current =
    target.kind === 'row' ? installsOnRow(planter.installs, target.row) : target.kind === 'toolbar' ? installsOnToolbar(planter.installs, target.toolbarId) : target.kind === 'planter' ? installsOnPlanter(planter.installs) : [];
  const removed = planter.installs
    .filter((i) => i.status === 'removed')
    .filter((i) => (target.kind === 'row' ? coversRow(i, target.row) : target.kind === 'toolbar' ? i.scope === 'toolbar' && i.toolbarId === target.toolbarId : target.kind === 'planter' ? i.scope === 'planter' : false))
    .sort(byRowUnitOrder);
  const where = target.kind === 'row' ? `row ${target.row}` : target.kind === 'toolbar' ? 'this toolbar' : 'the planter';
  const byId = (id: number) => planter.installs.find((i) => i.id === id) ?? null;

  if (mode.kind === 'add' || mode.kind === 'edit') {
    const install = mode.kind === 'edit' ? byId(mode.installId) : null;
    return (
      <InstallForm
        key={install ? `${install.id}-${install.version}` : 'new'}
        planter={planter}
        target={target}
        install={install}
        onReload={reload}
        onCancel={() => (target.kind === 'add' ? onClose() : setMode({ kind: 'list' }))}
        onDone={(saved) => {
          if (target.kind === 'add') return onClose();
          setMode({ kind: 'list' });
          setNotice(`${saved.component?.name ?? 'The part'} was ${install ? 'saved' : `added to ${placementText(saved, planter.toolbars)}`}.`);
        }}
      />
    );
  }
  if (mode.kind === 'remove') {
    const install = byId(mode.installId);
    if (!install) return null;
    return (
      <div className="space-y-4">
        <p>
          <strong>{install.component?.name}</strong> on {placementText(install, planter.toolbars)} will be marked removed. The record stays in the install history.
        </p>
        <RemoveInstallForm
          key={`${install.id}-${install.version}`}
          planter={planter}
          install={install}
          onReload={reload}
          onCancel={() => setMode({ kind: 'list' })}
          onDone={() => {
            setMode({ kind: 'list' });
            setNotice(`${install.component?.name ?? 'The part'} was marked removed.`);
          }}
        />
      </div>
    );
  }

  return (
    <div className="space-y-6">
      <Notice message={notice} onDone={() => setNotice(null)} />
      {canEdit && (
        <Button onClick={() => setMode({ kind: 'add' })} data-autofocus>
          <span aria-hidden="true">+</span> Add a component to {where}
        </Button>
      )}
      <section aria-labelledby="panel-now">
        <h3 id="panel-now" className="mb-2 text-lg font-bold text-ink-900">
          On {where} now
        </h3>
        {current.length === 0 ? (
          <p className="text-loam-700">Nothing recorded on {where}.</p>
        ) : (
          <ul className="space-y-3">
            {current.map((install) => (
              <InstallCard
                key={install.id}
                planter={planter}
                install={install}
                canEdit={canEdit}
                onEdit={() => setMode({ kind: 'edit', installId: install.id })}
                onRemove={() => setMode({ kind: 'remove', installId: install.id })}
                onDelete={() => setDeleting(install)}
              />
            ))}
          </ul>
        )}
      </section>
      {target.kind === 'row' && (
        <p className="text-loam-800">
          Parts on the bar or the planter as a whole are listed under{' '}
          {[...planter.toolbars]
            .filter((t) => target.row >= t.firstRow && target.row <= t.lastRow)
            .slice(0, 1)
            .map((t) => (
              <button key={t.id} type="button" className="min-h-9 font-semibold text-ink-700 underline underline-offset-2" onClick={() => onTarget({ kind: 'toolbar', toolbarId: t.id })}>
                {t.name}
              </button>
            ))}
          {planter.toolbars.some((t) => target.row >= t.firstRow && target.row <= t.lastRow) ? ' and ' : ''}
          <button type="button" className="min-h-9 font-semibold text-ink-700 underline underline-offset-2" onClick={() => onTarget({ kind: 'planter' })}>
            the whole planter
          </button>
          .
        </p>
      )}
      {removed.length > 0 && (
        <details>
          <summary className="min-h-11 cursor-pointer font-semibold text-ink-800">
            Removed from {where} ({removed.length})
          </summary>
          <ul className="mt-2 space-y-3">
            {removed.map((install) => (
              <InstallCard key={install.id} planter={planter} install={install} canEdit={canEdit} onEdit={() => setMode({ kind: 'edit', installId: install.id })} onDelete={() => setDeleting(install)} />
            ))}
          </ul>
        </details>
      )}
      <ConfirmDeleteDialog
        what={deleting ? `the record of ${deleting.component?.name ?? 'this part'}` : null}
        title="Erase this install record?"
        confirmLabel="Erase the record"
        onConfirm={() => remove.mutateAsync(deleting!.id)}
        onDeleted={() => setNotice('The record was erased.')}
        onClose={() => setDeleting(null)}
      >
        {deleting
          ? `This erases the record of ${deleting.component?.name ?? 'the part'} on ${placementText(deleting, planter.toolbars)} as if it was never fitted. If it came off the planter, use “Mark removed” instead: the history keeps it.`
          : null}
      </ConfirmDeleteDialog>
    </div>
  );
}

function InstallCard({
  planter,
  install,
  canEdit,
  onEdit,
  onRemove,
  onDelete,
}: {
  planter: PlanterDetail;
  install: Install;
  canEdit: boolean;
  onEdit: () => void;
  onRemove?: () => void;
  onDelete: () => void;
}) {
  const c = install.component;
  const name = c?.name ?? 'Unknown part';
  return (
    <li className="rounded-lg border border-loam-300 bg-white p-4">
      <div className="flex items-start gap-3">
        {c && <GlyphIcon category={c.category} size={24} />}
        <div className="min-w-0 flex-1">
          <p className="font-semibold text-ink-900">{name}</p>
          <p className="text-sm text-loam-700">
            {c ? `${c.partNumber} · ${categoryLabels[c.category]}` : null}
          </p>
        </div>
        {install.status === 'removed' ? (
          <StatusBadge tone="neutral" shape="cross">Removed</StatusBadge>
        ) : (
          <StatusBadge tone="good" shape="dot">Installed</StatusBadge>
        )}
      </div>
      <dl className="mt-3 grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-loam-700">On</dt>
        <dd className="font-semibold">{placementText(install, planter.toolbars)}</dd>
        <dt className="text-loam-700">Quantity</dt>
        <dd className="tabular">{install.quantity}</dd>
        <dt className="text-loam-700">Installed</dt>
        <dd>{install.installDate ? formatDate(install.installDate) : <span className="italic text-loam-700">date not recorded</span>}</dd>
        {install.pricePaidUsd !== null && (
          <>
            <dt className="text-loam-700">Price paid</dt>
            <dd className="tabular">{formatUsd(install.pricePaidUsd)}</dd>
          </>
        )}
        {install.workOrder && (
          <>
            <dt className="text-loam-700">Work order</dt>
            <dd className="font-mono">{install.workOrder}</dd>
          </>
        )}
        {install.serialNumbers?.length > 0 && (
          <>
            <dt className="text-loam-700">Serials</dt>
            <dd className="font-mono [overflow-wrap:anywhere]">{install.serialNumbers.join(', ')}</dd>
          </>
        )}
        {install.status === 'removed' && (
          <>
            <dt className="text-loam-700">Removed</dt>
            <dd>
              {install.removedDate ? formatDate(install.removedDate) : '—'}
              {install.removedReason ? `: ${install.removedReason}` : ''}
            </dd>
          </>
        )}
      </dl>
      {canEdit && (
        <div className="mt-3 flex flex-wrap gap-2">
          <Button variant="secondary" className="min-h-10 px-3" onClick={onEdit}>
            Edit<span className="sr-only"> {name}</span>
          </Button>
          {onRemove && install.status === 'installed' && (
            <Button variant="secondary" className="min-h-10 px-3" onClick={onRemove}>
              Mark removed<span className="sr-only"> {name}</span>
            </Button>
          )}
          <Button variant="ghost" className="min-h-10 px-3 text-brick-700 hover:bg-brick-50" onClick={onDelete}>
            Erase record<span className="sr-only"> of {name}</span>
          </Button>
        </div>
      )}
      <details className="mt-3">
        <summary className="min-h-9 cursor-pointer text-sm font-semibold text-ink-700">Photos and documents</summary>
        <div className="mt-2">
          <AttachmentsBlock accountId={planter.accountId} ownerType="install" ownerId={install.id} ownerLabel={`this ${name}`} canEdit={canEdit} compact headingLevel="h4" />
        </div>
      </details>
    </li>
  );
}
