import type { LoaderFunctionArgs } from 'react-router-dom';
import { accountListQueryOptions } from '@/features/accounts/api/accounts';
import { parseAccountListParams } from '@/features/accounts/api/list-params';
import { queryClient } from './prime';

export { AccountsPage as Component } from '@/features/accounts/components/accounts-page';

export function loader({ request }: LoaderFunctionArgs) {
  void queryClient.prefetchQuery(accountListQueryOptions(parseAccountListParams(new URL(request.url).searchParams)));
  return null;
}
