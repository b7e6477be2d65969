import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { RouteError } from './route-error';
import { RouteFallback } from './route-fallback';

/*
 * Every screen is its own lazily loaded route module (src/app/routes/*), so the sign-in page
 * ships without the table, the admin forms or the signed-in frame. Each route has its own
 * errorElement: a failure replaces that screen only.
 */
const errorElement = <RouteError />;

type RouteModule = Awaited<ReturnType<Exclude<RouteObject['lazy'], undefined | Record<string, unknown>>>>;

/**
 * If a route's code fails to download (a new deployment, a dropped connection), the router would
 * show an empty page: it never renders the errorElement of a route whose lazy() rejected. So a
 * failed import becomes a component that throws, which the route's errorElement does catch
 * (and offers a reload).
 */
function lazyRoute(load: () => Promise<RouteModule>): () => Promise<RouteModule> {
  return () =>
    load().catch((error: unknown) => ({
      Component: () => {
        throw error;
      },
    }));
}

const signedInRoutes: RouteObject[] = [
  { index: true, lazy: lazyRoute(() => import('./routes/home')), errorElement },
  { path: 'accounts', lazy: lazyRoute(() => import('./routes/accounts')), errorElement },
  { path: 'accounts/:accountId', lazy: lazyRoute(() => import('./routes/account-detail')), errorElement },
  { path: 'admin/users', lazy: lazyRoute(() => import('./routes/admin-users')), errorElement },
  { path: '*', lazy: lazyRoute(() => import('./routes/not-found')), errorElement },
];

export const routes: RouteObject[] = [
  {
    path: '/sign-in',
    lazy: lazyRoute(() => import('./routes/sign-in')),
    errorElement,
    hydrateFallbackElement: <RouteFallback />,
  },
  {
    path: '/',
    lazy: lazyRoute(() => import('./routes/app-shell')),
    errorElement,
    hydrateFallbackElement: <RouteFallback />,
    children: signedInRoutes,
  },
];

export const router = createBrowserRouter(routes);
