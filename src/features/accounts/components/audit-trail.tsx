import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { ErrorState, LoadingBlock } from '@/components/ui/states';
import type { AuditEntry } from '@/features/fleet/api/types';
import { FleetSection } from '@/features/fleet/components/section';
import { formatDateTime } from '@/features/fleet/lib/labels';
import { accountAuditQueryOptions } from '../api/accounts';

const fieldNames: Record<string, string> = {
  acresByCrop: 'Acres by crop',
  specialistId: 'Specialist',
  territoryId: 'Territory',
  roleOnFarm: 'Role on the farm',
  reminderOptIn: 'Season reminders',
  lat: 'Latitude',
  lng: 'Longitude',
  modelYear: 'Model year',
  hydraulicFlowGpm: 'Hydraulic flow (gpm)',
  hydraulicPressurePsi: 'Hydraulic pressure (psi)',
  remoteValves: 'Remote valves',
  ptoHp: 'PTO power (hp)',
  rowSpacingIn: 'Row spacing (in)',
  frameType: 'Frame',
  foldType: 'Fold',
  seedSupplyType: 'Seed supply',
  seedCapacityUnits: 'Seed capacity (units)',
  liquidTankCount: 'Liquid tanks',
  liquidTankGallons: 'Tank size (gal)',
  dryCapacityLb: 'Dry fertilizer (lb)',
  acresPerYear: 'Acres a year',
  tractorId: 'Tractor',
  farmSiteId: 'Farm site',
  componentId: 'Component',
  toolbarId: 'Toolbar',
  rowFrom: 'First row',
  rowTo: 'Last row',
  installDate: 'Install date',
  pricePaidUsd: 'Price paid (USD)',
  serialNumbers: 'Serial numbers',
  workOrder: 'Work order',
  removedDate: 'Removed on',
  removedReason: 'Reason removed',
};

function fieldName(key: string): string {
  if (fieldNames[key]) return fieldNames[key];
  const words = key.replace(/([A-Z])/g, ' $1').toLowerCase();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

function valueText(value: unknown): string {
  if (value === null || value === undefined || value === '') return 'empty';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (Array.isArray(value)) return value.length ? value.join(', ') : 'none';
  if (typeof value === 'object') {
    return Object.entries(value as Record<string, unknown>).map(([k, v]) => `${k} ${valueText(v)}`).join(', ') || 'none';
  }
  return String(value);
}

const actionMarks: Record<string, { mark: string; word: string }> = {
  create: { mark: '+', word: 'Added' },
  update: { mark: '~', word: 'Changed' },
  delete: { mark: '−', word: 'Removed' },
  upload: { mark: '↑', word: 'Uploaded' },
  import: { mark: '⇣', word: 'Imported' },
  stage: { mark: '→', word: 'Moved on' },
};

const PAGE = 15;

/** Who changed what on the account's records and when, newest first, with each field's before and after. */
export function AuditTrail({ accountId }: { accountId: number }) {
  const audit = useQuery(accountAuditQueryOptions(accountId));
  const [shown, setShown] = useState(PAGE);
  const items = audit.data ?? [];
  return (
    <FleetSection id="changes" title="Record of changes" count={audit.data?.length} description="Every change to this account's records: who made it, when, and what it was.">
      {audit.isPending && <LoadingBlock label="Loading the record of changes…" />}
      {audit.isError && <ErrorState title="The record of changes could not be loaded" message={audit.error.message} onRetry={() => void audit.refetch()} />}
      {audit.isSuccess && items.length === 0 && <p className="text-loam-700">No changes recorded yet.</p>}
      {items.length > 0 && (
        <ol className="relative space-y-0 border-l-2 border-loam-200 pl-0">
          {items.slice(0, shown).map((entry) => (
            <AuditItem key={entry.id} entry={entry} />
          ))}
        </ol>
      )}
      {items.length > shown && (
        <Button variant="secondary" className="mt-4" onClick={() => setShown((n) => n + PAGE * 2)}>
          Show {Math.min(PAGE * 2, items.length - shown)} older changes
        </Button>
      )}
    </FleetSection>
  );
}

function AuditItem({ entry }: { entry: AuditEntry }) {
  const action = actionMarks[entry.action] ?? { mark: '•', word: entry.action };
  const changes = Object.entries(entry.changes ?? {});
  return (
    <li className="relative py-2.5 pl-6">
      <span
        aria-hidden="true"
        className="absolute top-3 -left-[0.8rem] flex size-6 items-center justify-center rounded-full border-2 border-loam-300 bg-white text-sm font-bold text-ink-700"
      >
        {action.mark}
      </span>
      <p className="text-ink-950">
        <span className="sr-only">{action.word}: </span>
        {entry.summary ?? `${action.word} ${entry.entity}`}
      </p>
      <p className="text-sm text-loam-700">
        <time dateTime={entry.at}>{formatDateTime(entry.at)}</time> · {entry.userName ?? 'Rowpath'}
      </p>
      {changes.length > 0 && (
        <details className="mt-1">
          <summary className="inline-flex min-h-9 cursor-pointer items-center rounded text-sm font-semibold text-ink-700 underline underline-offset-2">
            {changes.length} {changes.length === 1 ? 'field' : 'fields'} changed
          </summary>
          <dl className="mt-1 grid gap-x-4 gap-y-1 rounded-lg bg-loam-50 p-3 text-sm sm:grid-cols-[max-content_1fr]">
            {changes.map(([key, value]) => {
              const [before, after] = Array.isArray(value) && value.length === 2 ? value : [undefined, value];
              return (
                <div key={key} className="contents">
                  <dt className="font-semibold text-loam-800">{fieldName(key)}</dt>
                  <dd className="text-ink-950 [overflow-wrap:anywhere]">
                    <span className="text-loam-700 line-through decoration-loam-400">{valueText(before)}</span>
                    <span aria-hidden="true"> → </span>
                    <span className="sr-only"> changed to </span>
                    <span className="font-semibold">{valueText(after)}</span>
                  </dd>
                </div>
              );
            })}
          </dl>
        </details>
      )}
    </li>
  );
}
