import type { LoaderFunctionArgs } from 'react-router-dom';
import { RequireRole } from '@/features/auth/components/require-auth';
import { catalogListQueryOptions } from '@/features/catalog/api/components';
import { parseCatalogParams } from '@/features/catalog/api/list-params';
import { CatalogPage } from '@/features/catalog/components/catalog-page';
import { currentUserForLoader, queryClient } from './prime';

export function Component() {
  return (
    <RequireRole roles={['admin', 'manager', 'specialist']}>
      <CatalogPage />
    </RequireRole>
  );
}

export async function loader({ request }: LoaderFunctionArgs) {
  const user = await currentUserForLoader();
  if (user && user.role !== 'grower') void queryClient.prefetchQuery(catalogListQueryOptions(parseCatalogParams(new URL(request.url).searchParams)));
  return null;
}
