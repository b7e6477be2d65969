import { componentCategories, type ComponentCategory } from '@shared/schemas/fleet';
import { catalogSorts, type CatalogFilters, type CatalogSort } from './components';

/* The catalog table's state lives in the URL; odd values fall back to the defaults, never an error. */

export const catalogPageSizes = [25, 50, 100] as const;
export const defaultCatalogFilters: CatalogFilters = { page: 1, pageSize: 50, sort: 'category' };

function positiveInt(value: string | null): number | undefined {
  if (value === null || !/^\d{1,9}$/.test(value)) return undefined;
  const n = Number(value);
  return n >= 1 ? n : undefined;
}

export function parseCatalogParams(params: URLSearchParams): CatalogFilters {
  const pageSize = positiveInt(params.get('pageSize'));
  const sort = params.get('sort');
  const category = params.get('category');
  const active = params.get('active');
  const q = params.get('q')?.trim().slice(0, 100);
  return {
    page: positiveInt(params.get('page')) ?? 1,
    pageSize: pageSize && (catalogPageSizes as readonly number[]).includes(pageSize) ? pageSize : defaultCatalogFilters.pageSize,
    sort: sort && (catalogSorts as readonly string[]).includes(sort) ? (sort as CatalogSort) : defaultCatalogFilters.sort,
    q: q || undefined,
    category: category && (componentCategories as readonly string[]).includes(category) ? (category as ComponentCategory) : undefined,
    active: active === 'true' || active === 'false' ? active : undefined,
  };
}

export function toCatalogParams(filters: CatalogFilters): URLSearchParams {
  const params = new URLSearchParams();
  if (filters.q) params.set('q', filters.q);
  if (filters.category) params.set('category', filters.category);
  if (filters.active) params.set('active', filters.active);
  if (filters.sort !== defaultCatalogFilters.sort) params.set('sort', filters.sort);
  if (filters.pageSize !== defaultCatalogFilters.pageSize) params.set('pageSize', String(filters.pageSize));
  if (filters.page !== 1) params.set('page', String(filters.page));
  return params;
}
