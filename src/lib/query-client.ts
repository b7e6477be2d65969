import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from './api';

/*
 * One QueryClient for the app (route loaders prime it too). A 401 "unauthenticated" from any
 * request means the session ended (expired, or disabled by an admin): listeners (the auth
 * feature) react by sending the user to sign-in. lib/ knows nothing of features, hence the hook.
 */

type Listener = () => void;
const sessionEndedListeners = new Set<Listener>();

export function onSessionEnded(listener: Listener): () => void {
  sessionEndedListeners.add(listener);
  return () => {
    sessionEndedListeners.delete(listener);
  };
}

function notifyIfSessionEnded(error: unknown): void {
  if (isApiError(error) && error.status === 401 && error.code === 'unauthenticated') {
    sessionEndedListeners.forEach((listener) => listener());
  }
}

export const queryClient = new QueryClient({
  queryCache: new QueryCache({ onError: notifyIfSessionEnded }),
  mutationCache: new MutationCache({ onError: notifyIfSessionEnded }),
  defaultOptions: {
    queries: {
      staleTime: 30_000,
      // A 4xx answer will not change on retry; network blips and 5xx get two more tries.
      retry: (failureCount, error) =>
        !(isApiError(error) && error.status >= 400 && error.status < 500) && failureCount < 2,
    },
    mutations: { retry: false },
  },
});
