import { useState } from 'react';
import { Link } from 'react-router-dom';
import { workingWidthFt } from '@shared/calc/sizing';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import type { AccountPlanter, FarmSite, Tractor } from '@/features/fleet/api/types';
import { Notice } from '@/features/fleet/components/form-bits';
import { FleetSection } from '@/features/fleet/components/section';
import { foldTypeLabels, formatNumber, frameTypeLabels, labelOf } from '@/features/fleet/lib/labels';
import { useSavePlanterMutation } from '../api/save-planter';
import { PlanterForm } from './planter-form';

/** A planter's rows as ticks on a bar: a glance at its size, drawn from the record. */
function RowTicks({ rows }: { rows: number }) {
  const w = 120;
  const pitch = (w - 8) / Math.max(rows, 1);
  return (
    <svg viewBox={`0 0 ${w} 26`} className="h-7 w-32 shrink-0" aria-hidden="true">
      <rect x="2" y="4" width={w - 4} height="5" rx="2" fill="#283052" />
      {Array.from({ length: rows }, (_, i) => (
        <rect key={i} x={4 + i * pitch + pitch / 2 - Math.min(1.5, pitch / 3)} y="10" width={Math.min(3, (pitch * 2) / 3)} height="12" rx="1" fill="#8a7c6a" />
      ))}
    </svg>
  );
}

interface PlantersSectionProps {
  accountId: number;
  planters: AccountPlanter[];
  tractors: Tractor[];
  farmSites: FarmSite[];
  canEdit: boolean;
}

/** The account's planters as cards; each opens the planter's drawing. Staff add planters here. */
export function PlantersSection({ accountId, planters, tractors, farmSites, canEdit }: PlantersSectionProps) {
  const [adding, setAdding] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const save = useSavePlanterMutation();
  const tractorName = new Map(tractors.map((t) => [t.id, t.name]));

  return (
    <FleetSection
      id="planters"
      title="Planters"
      count={planters.length}
      description="Open one to see each toolbar and row unit and what is on it."
      action={
        canEdit && (
          <Button onClick={() => setAdding(true)}>
            <span aria-hidden="true">+</span> Add a planter
          </Button>
        )
      }
    >
      <Notice message={notice} onDone={() => setNotice(null)} className="mb-3" />
      {planters.length === 0 ? (
        <p className="text-loam-700">No planters recorded yet.</p>
      ) : (
        <ul className="grid grid-cols-[repeat(auto-fill,minmax(17rem,1fr))] gap-4">
          {planters.map((p) => (
            <li key={p.id}>
              <Link
                to={`/planters/${p.id}`}
                className="group flex h-full flex-col gap-2 rounded-xl border-2 border-loam-200 bg-loam-50 p-4 hover:border-ink-400 hover:bg-white"
              >
                <span className="flex items-start justify-between gap-3">
                  <span className="text-lg font-bold text-ink-900 underline decoration-ink-300 underline-offset-4 group-hover:decoration-ink-800">{p.name}</span>
                  <RowTicks rows={p.rows} />
                </span>
                <span className="text-xl font-semibold text-ink-950 tabular">
                  {p.rows} rows × {formatNumber(p.rowSpacingIn)} in
                  <span className="ml-2 text-base font-normal text-loam-700">{formatNumber(workingWidthFt(p.rows, p.rowSpacingIn))} ft wide</span>
                </span>
                <span className="text-loam-800">
                  {[p.maker, p.modelYear, labelOf(frameTypeLabels, p.frameType), labelOf(foldTypeLabels, p.foldType)].filter(Boolean).join(' · ')}
                </span>
                <span className="mt-auto flex flex-wrap items-center gap-x-4 gap-y-1 text-ink-800">
                  <span className="inline-flex items-center gap-1.5 font-semibold">
                    <svg viewBox="0 0 16 16" className="size-4" aria-hidden="true">
                      <circle cx="8" cy="8" r="6" fill="#363f68" />
                    </svg>
                    <span className="tabular">{p.installCount}</span> {p.installCount === 1 ? 'component installed' : 'components installed'}
                  </span>
                  {p.tractorId && <span>Pulled by {tractorName.get(p.tractorId) ?? 'a tractor'}</span>}
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
      <Dialog open={adding} onClose={() => setAdding(false)} variant="panel" title="Add a planter" description="Rows, spacing and toolbars as they are on the machine today.">
        {adding && (
          <PlanterForm
            planter={null}
            tractors={tractors}
            farmSites={farmSites}
            busy={save.isPending}
            onCancel={() => setAdding(false)}
            onSubmit={(input, handleError) =>
              save.mutate(
                { mode: 'create', accountId, input },
                {
                  onSuccess: (planter) => {
                    setAdding(false);
                    setNotice(`${planter.name} was added. Open it to record what is installed.`);
                  },
                  onError: handleError,
                },
              )
            }
          />
        )}
      </Dialog>
    </FleetSection>
  );
}
