import { RequireRole } from '@/features/auth/components/require-auth';
import { rulePartsQueryOptions, rulesQueryOptions } from '@/features/catalog-rules/api/rules';
import { RulesPage } from '@/features/catalog-rules/components/rules-page';
import { currentUserForLoader, queryClient } from './prime';

export function Component() {
  return (
    <RequireRole roles={['admin', 'manager']}>
      <RulesPage />
    </RequireRole>
  );
}

export async function loader() {
  const user = await currentUserForLoader();
  if (user?.role === 'admin' || user?.role === 'manager') {
    void queryClient.prefetchQuery(rulesQueryOptions());
    void queryClient.prefetchQuery(rulePartsQueryOptions());
  }
  return null;
}
