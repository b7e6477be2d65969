import { forecastGroupBys, type ForecastGroupBy } from '@shared/schemas/forecast';

/*
 * The forecast's filters live in the URL (shareable, survives reload, printable as it is).
 * Parsing is forgiving: anything odd in the address falls back to the default, never an error.
 */

export interface ForecastFilters {
  groupBy: ForecastGroupBy;
  /** A season year, or undefined for every season. */
  season?: number;
  from?: string;
  to?: string;
  territoryId?: number;
  specialistId?: number;
  category?: string;
}

/** The groupings offered on the page (stage is the server's too, but not asked for here). */
export const pageGroupBys = ['season', 'month', 'quarter', 'territory', 'specialist', 'category', 'account'] as const satisfies readonly ForecastGroupBy[];

export const groupByLabels: Record<ForecastGroupBy, string> = {
  season: 'Season',
  month: 'Month',
  quarter: 'Quarter',
  territory: 'Territory',
  specialist: 'Specialist',
  category: 'Category',
  account: 'Account',
  stage: 'Stage',
};

export const defaultGroupBy: ForecastGroupBy = 'season';

/**
 * The season being sold now: after midsummer the shop is already working for next spring's
 * planting, so from July on "this season" is next year's (common practice at dealers).
 */
export function currentSeason(now: Date): number {
  return now.getUTCMonth() >= 6 ? now.getUTCFullYear() + 1 : now.getUTCFullYear();
}

const MONTH = /^\d{4}-(0[1-9]|1[0-2])$/;

function positiveInt(value: string | null): number | undefined {
  if (value === null || !/^\d{1,9}$/.test(value)) return undefined;
  const n = Number(value);
  return n >= 1 ? n : undefined;
}

function seasonYear(value: string | null): number | undefined {
  if (value === null || !/^\d{4}$/.test(value)) return undefined;
  const n = Number(value);
  return n >= 2000 && n <= 2100 ? n : undefined;
}

export function parseForecastParams(params: URLSearchParams): ForecastFilters {
  const groupBy = params.get('groupBy');
  const from = params.get('from') ?? '';
  const to = params.get('to') ?? '';
  const category = params.get('category')?.trim().slice(0, 40);
  const filters: ForecastFilters = {
    groupBy: groupBy && (pageGroupBys as readonly string[]).includes(groupBy) ? (groupBy as ForecastGroupBy) : defaultGroupBy,
    season: seasonYear(params.get('season')),
    from: MONTH.test(from) ? from : undefined,
    to: MONTH.test(to) ? to : undefined,
    territoryId: positiveInt(params.get('territoryId')),
    specialistId: positiveInt(params.get('specialistId')),
    category: category || undefined,
  };
  // An inverted range in a typed address: drop the end rather than ask the server for a 400.
  if (filters.from && filters.to && filters.from > filters.to) filters.to = undefined;
  return filters;
}

/** Writes filters back, leaving defaults out so addresses stay short. */
export function toForecastParams(filters: ForecastFilters): URLSearchParams {
  const params = new URLSearchParams();
  if (filters.groupBy !== defaultGroupBy) params.set('groupBy', filters.groupBy);
  if (filters.season) params.set('season', String(filters.season));
  if (filters.from) params.set('from', filters.from);
  if (filters.to) params.set('to', filters.to);
  if (filters.territoryId) params.set('territoryId', String(filters.territoryId));
  if (filters.specialistId) params.set('specialistId', String(filters.specialistId));
  if (filters.category) params.set('category', filters.category);
  return params;
}

/** The query the API takes for these filters (undefined values are left out by the api client). */
export function forecastQuery(filters: ForecastFilters): Record<string, string | number | undefined> {
  return {
    groupBy: filters.groupBy,
    season: filters.season,
    from: filters.from,
    to: filters.to,
    territoryId: filters.territoryId,
    specialistId: filters.specialistId,
    category: filters.category,
  };
}

export function hasNarrowingFilters(filters: ForecastFilters): boolean {
  return Boolean(filters.season || filters.from || filters.to || filters.territoryId || filters.specialistId || filters.category);
}
