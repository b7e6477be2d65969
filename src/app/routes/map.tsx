import { mapAccountsQueryOptions } from '@/features/map/api/map';
import { territoriesQueryOptions } from '@/features/territories/api/territories';
import { queryClient } from './prime';

export { MapPage as Component } from '@/features/map/components/map-page';

export function loader() {
  void queryClient.prefetchQuery(mapAccountsQueryOptions());
  void queryClient.prefetchQuery(territoriesQueryOptions());
  return null;
}
