import { useQueries } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import { quotaSchema, type QuotaRow } from '@shared/schemas/forecast';
import { Button } from '@/components/ui/button';
import { ErrorMark, inputClasses } from '@/components/ui/form-field';
import { ErrorState, Skeleton } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { isApiError } from '@/lib/api';
import { quotasQueryOptions } from '../api/forecast';
import { formatShare, formatUsd, parseUsdText } from '../api/format';
import { usePutQuotaMutation } from '../api/put-quota';

function AttainmentBar({ share }: { share: number | null }) {
  if (share === null) return <span className="text-loam-700">No quota</span>;
  const pct = Math.min(100, Math.round(share * 100));
  const met = share >= 1;
  return (
    <span className="flex items-center gap-2 whitespace-nowrap">
      <span className="relative h-3 w-16 shrink-0 overflow-hidden rounded-full bg-loam-200" aria-hidden="true">
        <span className={`absolute inset-y-0 left-0 rounded-full ${met ? 'bg-seedling-500' : 'bg-ink-600'}`} style={{ width: `${pct}%` }} />
      </span>
      <span className="w-12 text-right font-semibold tabular">{formatShare(share)}</span>
      {met && <StatusBadge tone="good" shape="dot">Met</StatusBadge>}
    </span>
  );
}

function QuotaEditor({ row }: { row: QuotaRow }) {
  const [text, setText] = useState(row.quotaUsd === null ? '' : row.quotaUsd.toLocaleString('en-US', { maximumFractionDigits: 2 }));
  const [error, setError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const putQuota = usePutQuotaMutation();
  const inputId = `quota-${row.territoryId}-${row.season}`;

  const submit = (event: FormEvent) => {
    event.preventDefault();
    setSaved(false);
    const quotaUsd = parseUsdText(text);
    if (quotaUsd === undefined) return setError('Enter the quota in dollars');
    // The shared schema: the browser refuses what the server would, in the same words.
    const parsedQuota = quotaSchema.safeParse({ territoryId: row.territoryId, season: row.season, quotaUsd });
    if (!parsedQuota.success) return setError(parsedQuota.error.issues[0]?.message ?? 'Check the quota');
    setError(null);
    putQuota.mutate(parsedQuota.data, {
      onSuccess: () => setSaved(true),
      onError: (failure) => setError(isApiError(failure) ? (failure.fields.quotaUsd ?? failure.message) : 'The quota could not be saved'),
    });
  };

  return (
    <form onSubmit={submit} noValidate className="flex items-start gap-2" data-quota-form={`${row.territoryId}-${row.season}`}>
      <div className="w-40">
        <label htmlFor={inputId} className="sr-only">
          Quota for {row.territoryName}, {row.season} season, in US dollars
        </label>
        <div className="relative">
          <span className="pointer-events-none absolute inset-y-0 left-3 flex items-center text-loam-700" aria-hidden="true">
            $
          </span>
          <input
            id={inputId}
            type="text"
            inputMode="decimal"
            className={`${inputClasses} pl-7 text-right tabular`}
            value={text}
            onChange={(event) => {
              setText(event.target.value);
              setSaved(false);
            }}
            aria-invalid={error ? true : undefined}
            aria-describedby={error ? `${inputId}-error` : undefined}
            autoComplete="off"
          />
        </div>
        {error && (
          <p id={`${inputId}-error`} className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-brick-700">
            <ErrorMark />
            <span>{error}</span>
          </p>
        )}
        {saved && (
          <p className="mt-1 text-sm font-semibold text-seedling-800" role="status">
            <span aria-hidden="true">✓ </span>Saved
          </p>
        )}
      </div>
      <Button type="submit" variant="secondary" busy={putQuota.isPending} className="print:hidden">
        Save<span className="sr-only"> the quota for {row.territoryName}, {row.season}</span>
      </Button>
    </form>
  );
}

/** Quota attainment per territory for this season and the next; a manager edits a quota in place. */
export function QuotaPanel({ seasons, canEdit }: { seasons: number[]; canEdit: boolean }) {
  const results = useQueries({ queries: seasons.map((season) => quotasQueryOptions(season)) });
  const failed = results.find((r) => r.isError);
  const rows = results.flatMap((r) => r.data?.territories ?? []);
  const loading = results.some((r) => r.isPending);

  return (
    <section aria-labelledby="quota-title" className="mb-8 break-inside-avoid" data-quota-panel>
      <h2 id="quota-title" className="mb-1 text-xl font-bold text-ink-900">
        Quota attainment
      </h2>
      <p className="mb-3 text-loam-700">
        Attainment to date is installed revenue against the territory’s quota; expected adds every open item at its stage’s probability.
      </p>
      {failed?.error ? (
        <ErrorState title="Quotas could not be loaded" message={failed.error.message} onRetry={() => results.forEach((r) => void r.refetch())} />
      ) : (
        <div className="overflow-x-auto rounded-xl border border-loam-200 bg-white shadow-sm" role="region" aria-label="Quota attainment" tabIndex={0}>
          <table className="w-full border-collapse text-left">
            <caption className="sr-only">Quota attainment per territory and season</caption>
            <thead className="bg-loam-100 text-sm text-loam-800">
              <tr>
                <th scope="col" className="px-3 py-3 font-semibold">Territory</th>
                <th scope="col" className="px-3 py-3 font-semibold">Season</th>
                <th scope="col" className="px-3 py-3 font-semibold">Quota</th>
                <th scope="col" className="px-3 py-3 text-right font-semibold">Installed</th>
                <th scope="col" className="px-3 py-3 font-semibold">Attainment to date</th>
                <th scope="col" className="px-3 py-3 text-right font-semibold">Expected</th>
                <th scope="col" className="px-3 py-3 text-right font-semibold">Expected share</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-loam-200">
              {loading && (
                <tr>
                  <td colSpan={7} className="px-4 py-4">
                    <Skeleton />
                  </td>
                </tr>
              )}
              {!loading && rows.length === 0 && (
                <tr>
                  <td colSpan={7} className="px-4 py-4 text-loam-700">
                    No territories to set quotas for.
                  </td>
                </tr>
              )}
              {!loading &&
                rows.map((row) => (
                  <tr key={`${row.territoryId}-${row.season}`} data-quota-row={`${row.territoryId}-${row.season}`}>
                    <th scope="row" className="px-3 py-2.5 font-semibold whitespace-nowrap text-ink-900">
                      {row.territoryName}
                    </th>
                    <td className="px-3 py-2.5 tabular">{row.season}</td>
                    <td className="px-3 py-2.5">
                      {canEdit ? <QuotaEditor row={row} /> : <span className="tabular">{row.quotaUsd === null ? 'None set' : formatUsd(row.quotaUsd)}</span>}
                    </td>
                    <td className="px-3 py-2.5 text-right tabular">{formatUsd(row.actualUsd)}</td>
                    <td className="px-3 py-2.5">
                      <AttainmentBar share={row.attainment} />
                    </td>
                    <td className="px-3 py-2.5 text-right tabular">{formatUsd(row.weightedUsd)}</td>
                    <td className="px-3 py-2.5 text-right font-semibold tabular">{formatShare(row.weightedAttainment)}</td>
                  </tr>
                ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
