import { planterSorts, type PlanterListFilters, type PlanterSort } from './planters';

/* The planters table's state lives in the URL; odd values fall back to the defaults. */

export const planterPageSizes = [25, 50, 100] as const;
export const minRowChoices = [8, 12, 16, 24, 32, 48] as const;
export const defaultPlanterFilters: PlanterListFilters = { page: 1, pageSize: 25, sort: 'account' };

function positiveInt(value: string | null): number | undefined {
  if (value === null || !/^\d{1,9}$/.test(value)) return undefined;
  const n = Number(value);
  return n >= 1 ? n : undefined;
}

export function parsePlanterListParams(params: URLSearchParams): PlanterListFilters {
  const pageSize = positiveInt(params.get('pageSize'));
  const sort = params.get('sort');
  const minRows = positiveInt(params.get('minRows'));
  const q = params.get('q')?.trim().slice(0, 100);
  return {
    page: positiveInt(params.get('page')) ?? 1,
    pageSize: pageSize && (planterPageSizes as readonly number[]).includes(pageSize) ? pageSize : defaultPlanterFilters.pageSize,
    sort: sort && (planterSorts as readonly string[]).includes(sort) ? (sort as PlanterSort) : defaultPlanterFilters.sort,
    q: q || undefined,
    minRows: minRows && minRows <= 96 ? minRows : undefined,
  };
}

export function toPlanterListParams(filters: PlanterListFilters): URLSearchParams {
  const params = new URLSearchParams();
  if (filters.q) params.set('q', filters.q);
  if (filters.minRows) params.set('minRows', String(filters.minRows));
  if (filters.sort !== defaultPlanterFilters.sort) params.set('sort', filters.sort);
  if (filters.pageSize !== defaultPlanterFilters.pageSize) params.set('pageSize', String(filters.pageSize));
  if (filters.page !== 1) params.set('page', String(filters.page));
  return params;
}
