import type { LoaderFunctionArgs } from 'react-router-dom';
import { RequireRole } from '@/features/auth/components/require-auth';
import { parseOutboxParams } from '@/features/reminders/api/outbox-params';
import { outboxQueryOptions } from '@/features/reminders/api/reminders';
import { OutboxPage } from '@/features/reminders/components/outbox-page';
import { currentUserForLoader, queryClient } from './prime';

export function Component() {
  return (
    <RequireRole roles={['admin', 'manager', 'specialist']}>
      <OutboxPage />
    </RequireRole>
  );
}

export async function loader({ request }: LoaderFunctionArgs) {
  const user = await currentUserForLoader();
  if (user && user.role !== 'grower') void queryClient.prefetchQuery(outboxQueryOptions(parseOutboxParams(new URL(request.url).searchParams)));
  return null;
}
