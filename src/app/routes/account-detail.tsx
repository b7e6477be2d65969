import type { LoaderFunctionArgs } from 'react-router-dom';
import { accountDetailQueryOptions } from '@/features/accounts/api/accounts';
import { parseAccountId } from '@/features/accounts/components/account-detail-page';
import { queryClient } from './prime';

export { AccountDetailPage as Component } from '@/features/accounts/components/account-detail-page';

export function loader({ params }: LoaderFunctionArgs) {
  const id = parseAccountId(params.accountId);
  if (id !== null) void queryClient.prefetchQuery(accountDetailQueryOptions(id));
  return null;
}
