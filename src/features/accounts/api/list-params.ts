import { accountSorts, type AccountListFilters, type AccountSort } from './accounts';

/*
 * The list's paging, sorting and search live in the URL (shareable, survives reload and Back).
 * Parsing is forgiving: anything odd in the address falls back to the default, never an error.
 */

export const accountPageSizes = [25, 50, 100] as const;
export const defaultAccountFilters: AccountListFilters = { page: 1, pageSize: 25, sort: 'name' };

function positiveInt(value: string | null): number | undefined {
  if (value === null || !/^\d{1,9}$/.test(value)) return undefined;
  const n = Number(value);
  return n >= 1 ? n : undefined;
}

export function parseAccountListParams(params: URLSearchParams): AccountListFilters {
  const pageSize = positiveInt(params.get('pageSize'));
  const sort = params.get('sort');
  const q = params.get('q')?.trim().slice(0, 100);
  return {
    page: positiveInt(params.get('page')) ?? defaultAccountFilters.page,
    pageSize: pageSize && (accountPageSizes as readonly number[]).includes(pageSize) ? pageSize : defaultAccountFilters.pageSize,
    sort: sort && (accountSorts as readonly string[]).includes(sort) ? (sort as AccountSort) : defaultAccountFilters.sort,
    q: q || undefined,
    territoryId: positiveInt(params.get('territoryId')),
  };
}

/** Writes filters back, leaving defaults out so addresses stay short. */
export function toAccountListParams(filters: AccountListFilters): URLSearchParams {
  const params = new URLSearchParams();
  if (filters.q) params.set('q', filters.q);
  if (filters.territoryId) params.set('territoryId', String(filters.territoryId));
  if (filters.sort !== defaultAccountFilters.sort) params.set('sort', filters.sort);
  if (filters.pageSize !== defaultAccountFilters.pageSize) params.set('pageSize', String(filters.pageSize));
  if (filters.page !== defaultAccountFilters.page) params.set('page', String(filters.page));
  return params;
}
