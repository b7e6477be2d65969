import { useQueries } from '@tanstack/react-query';
import type { ForecastGroupBy } from '@shared/schemas/forecast';
import { Skeleton, ErrorState } from '@/components/ui/states';
import { forecastQueryOptions, joinSeasons, panelFilters, type DrillTarget } from '../api/forecast';
import type { ForecastFilters } from '../api/forecast-params';
import { formatUsd } from '../api/format';

/**
 * This season and next, side by side, for one grouping (category or specialist): expected
 * (weighted) revenue large, the full pipeline beneath it. Every figure opens its items.
 */
function SeasonPairPanel({
  title,
  groupBy,
  filters,
  seasons,
  onDrill,
}: {
  title: string;
  groupBy: ForecastGroupBy;
  filters: ForecastFilters;
  seasons: number[];
  onDrill: (target: DrillTarget) => void;
}) {
  const results = useQueries({ queries: seasons.map((season) => forecastQueryOptions(panelFilters(filters, groupBy, season))) });
  const failed = results.find((r) => r.isError);
  const loading = results.some((r) => r.isPending);
  const rows = joinSeasons(
    seasons,
    results.map((r) => r.data?.rows),
  );
  const headingId = `panel-${groupBy}`;

  return (
    <section aria-labelledby={headingId} className="rounded-xl border border-loam-200 bg-white p-4 shadow-sm break-inside-avoid" data-season-panel={groupBy}>
      <h3 id={headingId} className="mb-2 text-lg font-bold text-ink-900">
        {title}
      </h3>
      {failed?.error ? (
        <ErrorState title={`${title} could not be loaded`} message={failed.error.message} onRetry={() => results.forEach((r) => void r.refetch())} />
      ) : (
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">
            {title}, expected revenue for the {seasons.join(' and ')} seasons
          </caption>
          <thead className="text-sm text-loam-800">
            <tr className="border-b border-loam-200">
              <th scope="col" className="py-2 pr-2 font-semibold">
                {groupBy === 'category' ? 'Category' : 'Specialist'}
              </th>
              {seasons.map((season) => (
                <th key={season} scope="col" className="px-2 py-2 text-right font-semibold">
                  {season} expected
                </th>
              ))}
            </tr>
          </thead>
          <tbody className="divide-y divide-loam-100">
            {loading &&
              Array.from({ length: 4 }, (_, i) => (
                <tr key={i}>
                  <td className="py-3" colSpan={seasons.length + 1}>
                    <Skeleton />
                  </td>
                </tr>
              ))}
            {!loading && rows.length === 0 && (
              <tr>
                <td colSpan={seasons.length + 1} className="py-4 text-loam-700">
                  No roadmap items in these seasons.
                </td>
              </tr>
            )}
            {!loading &&
              rows.map((row) => (
                <tr key={row.key}>
                  <th scope="row" className="py-1.5 pr-2 font-semibold text-ink-900">
                    {row.label}
                  </th>
                  {seasons.map((season) => {
                    const figures = row.bySeason[season];
                    return (
                      <td key={season} className="px-1 py-1 text-right tabular">
                        <button
                          type="button"
                          disabled={figures.itemCount === 0}
                          aria-label={`${row.label}, ${season} season: ${formatUsd(figures.weightedUsd)} expected of ${formatUsd(figures.pipelineUsd)} pipeline. Show the items`}
                          onClick={() => onDrill({ filters: panelFilters(filters, groupBy, season), key: row.key, label: `${row.label}, ${season} season` })}
                          className="inline-flex min-h-11 w-full flex-col items-end justify-center rounded-lg px-2 hover:bg-ink-50 disabled:cursor-default disabled:hover:bg-transparent"
                        >
                          {/* The visible words, "$X expected of $Y", are in the spoken name as they stand, so a voice user can say what they see. */}
                          <span className="font-semibold text-ink-900">{formatUsd(figures.weightedUsd)}</span>{' '}
                          <span className="text-sm whitespace-nowrap text-loam-700">expected of {formatUsd(figures.pipelineUsd)}</span>
                        </button>
                      </td>
                    );
                  })}
                </tr>
              ))}
          </tbody>
        </table>
      )}
    </section>
  );
}

export function SeasonPanels({ filters, season, onDrill }: { filters: ForecastFilters; season: number; onDrill: (target: DrillTarget) => void }) {
  const seasons = [season, season + 1];
  return (
    <section aria-labelledby="season-panels-title" className="mb-8">
      <h2 id="season-panels-title" className="mb-1 text-xl font-bold text-ink-900">
        The {season} season and the next
      </h2>
      <p className="mb-3 text-loam-700">Expected revenue (each item × its stage’s probability) of the full pipeline. Choose a figure to see its items.</p>
      <div className="grid gap-4 lg:grid-cols-2 print:grid-cols-2">
        <SeasonPairPanel title="By category" groupBy="category" filters={filters} seasons={seasons} onDrill={onDrill} />
        <SeasonPairPanel title="By specialist" groupBy="specialist" filters={filters} seasons={seasons} onDrill={onDrill} />
      </div>
    </section>
  );
}
