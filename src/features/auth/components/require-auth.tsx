import { useQuery } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import type { Role } from '@shared/schemas/auth';
import { LogoMark } from '@/components/ui/logo';
import { ErrorState, LoadingBlock } from '@/components/ui/states';
import { meQueryOptions } from '../api/me';
import { CurrentUserProvider, useCurrentUser } from './current-user';

/**
 * Lets its children render only for a signed-in user: asks GET /api/auth/me and sends anyone
 * without a session (401) to /sign-in, remembering where they were going. The server checks
 * every request on its own; this only spares people screens they cannot use.
 */
export function RequireAuth({ children }: { children: ReactNode }) {
  const location = useLocation();
  const me = useQuery(meQueryOptions());

  if (me.isPending) {
    return (
      <div className="flex min-h-dvh flex-col items-center justify-center gap-2">
        <LogoMark className="size-12" />
        <LoadingBlock label="Checking your session…" />
      </div>
    );
  }
  if (me.isError) {
    return (
      <main className="mx-auto max-w-lg px-4 py-16">
        <ErrorState
          title="Rowpath could not check your session"
          message={me.error.message}
          onRetry={() => void me.refetch()}
          retrying={me.isFetching}
        />
      </main>
    );
  }
  if (!me.data) {
    return <Navigate to="/sign-in" replace state={{ from: `${location.pathname}${location.search}` }} />;
  }
  return <CurrentUserProvider user={me.data}>{children}</CurrentUserProvider>;
}

/** For screens one role owns (e.g. Users for admins): others get a plain explanation. */
export function RequireRole({ roles, children }: { roles: readonly Role[]; children: ReactNode }) {
  const user = useCurrentUser();
  if (roles.includes(user.role)) return <>{children}</>;
  return (
    <div className="max-w-prose">
      <h1 tabIndex={-1} data-page-title className="text-2xl font-bold text-ink-900">
        Not part of your role
      </h1>
      <p className="mt-2 text-loam-800">
        This screen is for {roles.join(' and ')} accounts. If you need it, ask your Rowpath administrator.
      </p>
    </div>
  );
}
