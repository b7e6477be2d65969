import { createContext, use, type ReactNode } from 'react';
import type { SessionUser } from '@shared/schemas/auth';

const CurrentUserContext = createContext<SessionUser | null>(null);

export function CurrentUserProvider({ user, children }: { user: SessionUser; children: ReactNode }) {
  return <CurrentUserContext value={user}>{children}</CurrentUserContext>;
}

/** The signed-in user. Only valid below RequireAuth, which guarantees one. */
export function useCurrentUser(): SessionUser {
  const user = use(CurrentUserContext);
  if (!user) throw new Error('useCurrentUser() must be used below <RequireAuth>');
  return user;
}
