import type { LoaderFunctionArgs } from 'react-router-dom';
import { RequireRole } from '@/features/auth/components/require-auth';
import { sentMailQueryOptions } from '@/features/sent-mail/api/sent-mail';
import { parseMailId, SentMailMessagePage } from '@/features/sent-mail/components/sent-mail-message-page';
import { currentUserForLoader, queryClient } from './prime';

export function Component() {
  return (
    <RequireRole roles={['admin']}>
      <SentMailMessagePage />
    </RequireRole>
  );
}

export async function loader({ params }: LoaderFunctionArgs) {
  const user = await currentUserForLoader();
  const id = parseMailId(params.mailId);
  if (user?.role === 'admin' && id !== null) void queryClient.prefetchQuery(sentMailQueryOptions(id));
  return null;
}
