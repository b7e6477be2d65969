import type { LoaderFunctionArgs } from 'react-router-dom';
import { RequireRole } from '@/features/auth/components/require-auth';
import { parseSentMailParams, sentMailListQueryOptions } from '@/features/sent-mail/api/sent-mail';
import { SentMailPage } from '@/features/sent-mail/components/sent-mail-page';
import { currentUserForLoader, queryClient } from './prime';

export function Component() {
  return (
    <RequireRole roles={['admin']}>
      <SentMailPage />
    </RequireRole>
  );
}

export async function loader({ request }: LoaderFunctionArgs) {
  const user = await currentUserForLoader();
  if (user?.role === 'admin') void queryClient.prefetchQuery(sentMailListQueryOptions(parseSentMailParams(new URL(request.url).searchParams)));
  return null;
}
