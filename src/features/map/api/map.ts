import { queryOptions } from '@tanstack/react-query';
import type { FeatureCollection } from 'geojson';
import type { MapMarker } from '@shared/schemas/visits';
import { api } from '@/lib/api';

export type { MapMarker };

export interface MapAccountsResponse {
  season: number;
  items: MapMarker[];
  /** Accounts in scope with no map location (not drawn). */
  withoutLocation: number;
}

export const mapKeys = {
  all: ['map'] as const,
  accounts: () => [...mapKeys.all, 'accounts'] as const,
};

/** GET /api/map/accounts — markers for every account in the user's scope; the page filters them. */
export const mapAccountsQueryOptions = () =>
  queryOptions({
    queryKey: mapKeys.accounts(),
    queryFn: ({ signal }) => api.get<MapAccountsResponse>('/api/map/accounts', undefined, signal),
  });

/** The shipped county and state outlines (public/basemap); static, so fetched once per session. */
export const basemapQueryOptions = () =>
  queryOptions({
    queryKey: [...mapKeys.all, 'basemap'] as const,
    queryFn: async ({ signal }) => {
      const response = await fetch('/basemap/territory.json', { signal, credentials: 'same-origin' });
      if (!response.ok) throw new Error('The base map could not be loaded.');
      return (await response.json()) as FeatureCollection;
    },
    staleTime: Infinity,
    gcTime: Infinity,
    retry: 1,
  });
