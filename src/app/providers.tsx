import { QueryClientProvider } from '@tanstack/react-query';
import { useEffect, type ReactNode } from 'react';
import { authKeys } from '@/features/auth/api/me';
import { onSessionEnded, queryClient } from '@/lib/query-client';

export function Providers({ children }: { children: ReactNode }) {
  // A 401 on any request means the session is over: mark "no user", and the guard sends the
  // person to sign-in (then back to where they were).
  useEffect(() => onSessionEnded(() => queryClient.setQueryData(authKeys.me(), null)), []);
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
