import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { ForecastGroupBy, ForecastItem, ForecastResult, ForecastRow, QuotaRow } from '@shared/schemas/forecast';
import { api, buildQueryString } from '@/lib/api';
import { forecastQuery, type ForecastFilters } from './forecast-params';

export type { ForecastItem, ForecastResult, ForecastRow, QuotaRow };

/** What a drill-down asks for: the filters of the chart or panel it came from plus one group key. */
export interface DrillTarget {
  filters: ForecastFilters;
  key: string;
  label: string;
}

export interface ForecastItemsResponse {
  items: ForecastItem[];
  total: number;
}

export interface QuotaListResponse {
  season: number;
  territories: QuotaRow[];
  totals: { quotaUsd: number; pipelineUsd: number; actualUsd: number; weightedUsd: number };
}

export const forecastKeys = {
  all: ['forecast'] as const,
  groups: () => [...forecastKeys.all, 'groups'] as const,
  group: (filters: ForecastFilters) => [...forecastKeys.groups(), filters] as const,
  items: (target: DrillTarget, page: number, pageSize: number) =>
    [...forecastKeys.all, 'items', target.filters, target.key, page, pageSize] as const,
  quotas: () => [...forecastKeys.all, 'quotas'] as const,
  quota: (season: number) => [...forecastKeys.quotas(), season] as const,
};

/** GET /api/forecast — admin: all; manager: their territories; specialist: their own items; grower: 403. */
export const forecastQueryOptions = (filters: ForecastFilters) =>
  queryOptions({
    queryKey: forecastKeys.group(filters),
    queryFn: ({ signal }) => api.get<ForecastResult>('/api/forecast', forecastQuery(filters), signal),
    placeholderData: keepPreviousData,
  });

/** GET /api/forecast/items — the items behind one group key, a page at a time, largest expected first. */
export const forecastItemsQueryOptions = (target: DrillTarget, page: number, pageSize: number) =>
  queryOptions({
    queryKey: forecastKeys.items(target, page, pageSize),
    queryFn: ({ signal }) =>
      api.get<ForecastItemsResponse>('/api/forecast/items', { ...forecastQuery(target.filters), key: target.key, page, pageSize }, signal),
    placeholderData: keepPreviousData,
  });

/** GET /api/quotas?season — admin and managers only (specialists get 403, so do not ask). */
export const quotasQueryOptions = (season: number) =>
  queryOptions({
    queryKey: forecastKeys.quota(season),
    queryFn: ({ signal }) => api.get<QuotaListResponse>('/api/quotas', { season }, signal),
  });

/** The CSV of the grouped rows (or, with a key, of the items behind it) with the same filters. */
export function forecastExportHref(filters: ForecastFilters, key?: string): string {
  return `/api/forecast/export.csv${buildQueryString({ ...forecastQuery(filters), key })}`;
}

export interface SeasonPairRow {
  key: string;
  label: string;
  /** Figures per season; a group absent from a season counts as zero there. */
  bySeason: Record<number, { pipelineUsd: number; weightedUsd: number; actualUsd: number; itemCount: number }>;
}

const zero = { pipelineUsd: 0, weightedUsd: 0, actualUsd: 0, itemCount: 0 };

/**
 * Joins one grouping's rows for several seasons into one row per group (a category sold in 2028
 * but not 2027 still gets a line), ordered by the combined weighted revenue, largest first.
 */
export function joinSeasons(seasons: number[], results: (ForecastRow[] | undefined)[]): SeasonPairRow[] {
  const byKey = new Map<string, SeasonPairRow>();
  seasons.forEach((season, i) => {
    for (const row of results[i] ?? []) {
      const entry = byKey.get(row.key) ?? { key: row.key, label: row.label, bySeason: {} };
      entry.bySeason[season] = { pipelineUsd: row.pipelineUsd, weightedUsd: row.weightedUsd, actualUsd: row.actualUsd, itemCount: row.itemCount };
      byKey.set(row.key, entry);
    }
  });
  const rows = [...byKey.values()];
  for (const row of rows) for (const season of seasons) row.bySeason[season] ??= { ...zero };
  const weight = (row: SeasonPairRow) => seasons.reduce((n, s) => n + row.bySeason[s].weightedUsd, 0);
  return rows.sort((a, b) => weight(b) - weight(a) || a.label.localeCompare(b.label));
}

/** Filters for one panel: the page's filters, one season, grouped by the panel's dimension. */
export function panelFilters(filters: ForecastFilters, groupBy: ForecastGroupBy, season: number): ForecastFilters {
  return {
    groupBy,
    season,
    territoryId: filters.territoryId,
    // A panel grouped by a dimension shows every value of it, so that dimension's filter is not applied.
    specialistId: groupBy === 'specialist' ? undefined : filters.specialistId,
    category: groupBy === 'category' ? undefined : filters.category,
  };
}
