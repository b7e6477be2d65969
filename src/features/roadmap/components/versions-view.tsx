import { useQuery } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';
import { versionCreateSchema } from '@shared/schemas/roadmap';
import { Button } from '@/components/ui/button';
import { FormAlert, SelectField, TextField } from '@/components/ui/form-field';
import { EmptyState, ErrorState, LoadingBlock } from '@/components/ui/states';
import { roadmapVersionQueryOptions, roadmapVersionsQueryOptions, type Roadmap, type RoadmapItem } from '../api/roadmap';
import { useSaveVersionMutation } from '../api/save-version';
import { formatDateTime, formatUsd, formatUsdChange } from '../model/format';
import { STAGE_META } from '../model/stages';
import { diffRoadmaps, type DiffableRoadmap } from '../model/version-diff';

const NOW = 'now';

/** Saved versions of the roadmap, and any two of them (or one and the roadmap now) side by side. */
export function VersionsView({ accountId, roadmap, canEdit }: { accountId: number; roadmap: Roadmap; canEdit: boolean }) {
  const versions = useQuery(roadmapVersionsQueryOptions(accountId));
  const [left, setLeft] = useState<string | null>(null);
  const [right, setRight] = useState<string>(NOW);
  const list = versions.data ?? [];
  const leftChoice = left ?? (list[0] ? String(list[0].id) : NOW);

  return (
    <div className="space-y-5" data-versions-view>
      {canEdit && <SaveVersionForm accountId={accountId} onSaved={(id) => setLeft(String(id))} />}
      {versions.isPending && <LoadingBlock label="Loading saved versions…" />}
      {versions.isError && <ErrorState title="The saved versions could not be loaded" message={versions.error.message} onRetry={() => void versions.refetch()} />}
      {versions.isSuccess && list.length === 0 && (
        <EmptyState title="No saved versions yet">Save the roadmap under a name (e.g. “Shown at the winter meeting”) to compare it with later changes.</EmptyState>
      )}
      {versions.isSuccess && list.length > 0 && (
        <>
          <div className="overflow-x-auto rounded-xl border border-loam-200 bg-white shadow-sm">
            <table className="w-full border-collapse text-left">
              <caption className="sr-only">Saved versions, newest first</caption>
              <thead className="bg-loam-100 text-sm text-loam-800">
                <tr>
                  <th scope="col" className="px-4 py-2 font-semibold">
                    Version
                  </th>
                  <th scope="col" className="px-4 py-2 font-semibold">
                    Saved
                  </th>
                  <th scope="col" className="px-4 py-2 font-semibold">
                    By
                  </th>
                </tr>
              </thead>
              <tbody className="divide-y divide-loam-200">
                {list.map((v) => (
                  <tr key={v.id} data-version-row={v.name}>
                    <td className="px-4 py-2.5 font-semibold text-ink-950">{v.name}</td>
                    <td className="px-4 py-2.5 tabular">{formatDateTime(v.createdAt)}</td>
                    <td className="px-4 py-2.5">{v.createdBy ?? '—'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>

          <section aria-labelledby="versions-compare-title" className="rounded-xl border border-loam-200 bg-white p-5 shadow-sm">
            <h3 id="versions-compare-title" className="text-lg font-bold text-ink-900">
              Compare two versions
            </h3>
            <div className="mt-3 grid gap-3 sm:grid-cols-2">
              <SelectField
                label="Before"
                value={leftChoice}
                onChange={(e) => setLeft(e.target.value)}
                options={[...list.map((v) => ({ value: String(v.id), label: v.name })), { value: NOW, label: 'The roadmap now' }]}
              />
              <SelectField
                label="After"
                value={right}
                onChange={(e) => setRight(e.target.value)}
                options={[{ value: NOW, label: 'The roadmap now' }, ...list.map((v) => ({ value: String(v.id), label: v.name }))]}
              />
            </div>
            <VersionDiff left={leftChoice} right={right} roadmap={roadmap} names={new Map(list.map((v) => [String(v.id), v.name]))} />
          </section>
        </>
      )}
    </div>
  );
}

function SaveVersionForm({ accountId, onSaved }: { accountId: number; onSaved: (id: number) => void }) {
  const save = useSaveVersionMutation(accountId);
  const [name, setName] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  return (
    <form
      className="flex flex-wrap items-end gap-3 rounded-xl border border-loam-200 bg-white p-5 shadow-sm"
      aria-label="Save this version"
      noValidate
      onSubmit={(event) => {
        event.preventDefault();
        setSaved(null);
        const parsed = versionCreateSchema.safeParse({ name });
        if (!parsed.success) {
          setError(parsed.error.issues[0]?.message ?? 'Name the version');
          return;
        }
        setError(null);
        save.mutate(parsed.data.name, {
          onSuccess: ({ version }) => {
            setSaved(`Saved “${version.name}”.`);
            setName('');
            onSaved(version.id);
          },
          onError: (err) => setError(err.message),
        });
      }}
    >
      <TextField label="Version name" className="min-w-64 flex-1" value={name} onChange={(e) => setName(e.target.value)} error={error ?? undefined} hint="A snapshot of every season as it stands now." maxLength={120} />
      <Button type="submit" busy={save.isPending}>
        Save this version
      </Button>
      <p role="status" className="w-full font-semibold text-seedling-800 empty:hidden">
        {saved}
      </p>
    </form>
  );
}

function useSide(choice: string, roadmap: Roadmap) {
  const id = choice === NOW ? null : Number(choice);
  const query = useQuery({ ...roadmapVersionQueryOptions(id ?? 0), enabled: id !== null });
  if (id === null) return { data: roadmap as DiffableRoadmap, pending: false, error: null as Error | null };
  return { data: query.data?.snapshot as DiffableRoadmap | undefined, pending: query.isPending, error: query.error };
}

function ItemLine({ item, children }: { item: RoadmapItem; children?: ReactNode }) {
  return (
    <li className="flex flex-wrap items-baseline gap-x-2">
      <span className="font-semibold text-ink-950">{item.partName}</span>
      <span className="text-sm text-loam-700">
        {item.planterName ?? ''} · {formatUsd(item.costUsd)}
      </span>
      {children}
    </li>
  );
}

function VersionDiff({ left, right, roadmap, names }: { left: string; right: string; roadmap: Roadmap; names: Map<string, string> }) {
  const a = useSide(left, roadmap);
  const b = useSide(right, roadmap);
  if (left === right) return <p className="mt-4 text-loam-700">Choose two different versions.</p>;
  if (a.pending || b.pending) return <LoadingBlock label="Loading the versions…" />;
  if (a.error || b.error || !a.data || !b.data) return <FormAlert>{(a.error ?? b.error)?.message ?? 'A version could not be loaded.'}</FormAlert>;
  const diff = diffRoadmaps(a.data, b.data);
  const nameOf = (c: string) => (c === NOW ? 'the roadmap now' : `“${names.get(c) ?? c}”`);
  const nothing = diff.added.length + diff.removed.length + diff.moved.length + diff.restaged.length === 0;

  return (
    <div className="mt-5 space-y-4" data-version-diff>
      <p className="text-loam-800">
        From {nameOf(left)} to {nameOf(right)}:
      </p>
      <dl className="grid gap-3 sm:grid-cols-3">
        <div className="rounded-lg bg-loam-100 px-4 py-3">
          <dt className="text-sm font-semibold text-loam-700">Total cost</dt>
          <dd className="tabular">
            {formatUsd(diff.costBeforeUsd)} → <strong>{formatUsd(diff.costAfterUsd)}</strong> <span className="text-loam-700">({formatUsdChange(diff.costDeltaUsd)})</span>
          </dd>
        </div>
        <div className="rounded-lg bg-loam-100 px-4 py-3" data-waste-delta={diff.wasteDeltaUsd ?? ''}>
          <dt className="text-sm font-semibold text-loam-700">Thrown away</dt>
          <dd className="tabular">
            {diff.wasteBeforeUsd === null ? 'not valued' : formatUsd(diff.wasteBeforeUsd)} → <strong>{diff.wasteAfterUsd === null ? 'not valued' : formatUsd(diff.wasteAfterUsd)}</strong>{' '}
            {diff.wasteDeltaUsd === null ? (
              <span className="block text-sm text-brick-800">One side is an order that does not work, so its waste is not valued.</span>
            ) : (
              <span className="text-loam-700">({formatUsdChange(diff.wasteDeltaUsd)})</span>
            )}
          </dd>
        </div>
        <div className="rounded-lg bg-loam-100 px-4 py-3">
          <dt className="text-sm font-semibold text-loam-700">Items</dt>
          <dd className="tabular">
            {diff.added.length} added · {diff.removed.length} removed · {diff.moved.length} moved · {diff.unchangedCount} unchanged
          </dd>
        </div>
      </dl>

      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-left tabular">
          <caption className="sr-only">Cost by season, before and after</caption>
          <thead className="text-sm text-loam-800">
            <tr>
              <th scope="col" className="py-1 pr-4 font-semibold">
                Season
              </th>
              <th scope="col" className="py-1 pr-4 text-right font-semibold">
                Before
              </th>
              <th scope="col" className="py-1 pr-4 text-right font-semibold">
                After
              </th>
              <th scope="col" className="py-1 text-right font-semibold">
                Change
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-loam-200">
            {diff.seasons.map((s) => (
              <tr key={s.season}>
                <th scope="row" className="py-1.5 pr-4 font-semibold">
                  {s.season}
                </th>
                <td className="py-1.5 pr-4 text-right">{formatUsd(s.costBeforeUsd)}</td>
                <td className="py-1.5 pr-4 text-right">{formatUsd(s.costAfterUsd)}</td>
                <td className="py-1.5 text-right">{formatUsdChange(s.costAfterUsd - s.costBeforeUsd)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      {nothing ? (
        <p className="text-loam-800">No item was added, removed, moved or re-staged.</p>
      ) : (
        <div className="grid gap-4 md:grid-cols-2">
          {diff.added.length > 0 && (
            <div>
              <h4 className="font-bold text-ink-900">
                <span aria-hidden="true">+ </span>Added
              </h4>
              <ul className="mt-1 space-y-1">
                {diff.added.map((i) => (
                  <ItemLine key={i.id} item={i}>
                    <span className="text-sm">in {i.season}</span>
                  </ItemLine>
                ))}
              </ul>
            </div>
          )}
          {diff.removed.length > 0 && (
            <div>
              <h4 className="font-bold text-ink-900">
                <span aria-hidden="true">− </span>Removed
              </h4>
              <ul className="mt-1 space-y-1">
                {diff.removed.map((i) => (
                  <ItemLine key={i.id} item={i}>
                    <span className="text-sm">was in {i.season}</span>
                  </ItemLine>
                ))}
              </ul>
            </div>
          )}
          {diff.moved.length > 0 && (
            <div data-diff-moved>
              <h4 className="font-bold text-ink-900">
                <span aria-hidden="true">⇄ </span>Moved
              </h4>
              <ul className="mt-1 space-y-1">
                {diff.moved.map((m) => (
                  <ItemLine key={m.after.id} item={m.after}>
                    <span className="text-sm font-semibold">
                      {m.before.season} → {m.after.season}
                    </span>
                  </ItemLine>
                ))}
              </ul>
            </div>
          )}
          {diff.restaged.length > 0 && (
            <div>
              <h4 className="font-bold text-ink-900">Stage changed</h4>
              <ul className="mt-1 space-y-1">
                {diff.restaged.map((m) => (
                  <ItemLine key={m.after.id} item={m.after}>
                    <span className="text-sm">
                      {STAGE_META[m.before.stage].label} → {STAGE_META[m.after.stage].label}
                    </span>
                  </ItemLine>
                ))}
              </ul>
            </div>
          )}
        </div>
      )}
    </div>
  );
}
