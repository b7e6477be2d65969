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
  { path: 'planters', lazy: lazyRoute(() => import('./routes/planters')), errorElement },
  { path: 'planters/:planterId', lazy: lazyRoute(() => import('./routes/planter-detail')), errorElement },
  { path: 'catalog', lazy: lazyRoute(() => import('./routes/catalog')), errorElement },
  { path: 'planters/:id/sizing', lazy: lazyRoute(() => import('./routes/planter-sizing')), errorElement },
  { path: 'sizing', lazy: lazyRoute(() => import('./routes/sizing-calculator')), errorElement },
  { path: 'accounts/:accountId/roadmap', lazy: lazyRoute(() => import('./routes/account-roadmap')), errorElement },
  { path: 'roadmap', lazy: lazyRoute(() => import('./routes/grower-roadmap')), errorElement },
  { path: 'catalog-rules', lazy: lazyRoute(() => import('./routes/catalog-rules')), errorElement },
  { path: 'map', lazy: lazyRoute(() => import('./routes/map')), errorElement },
  { path: 'week-plan', lazy: lazyRoute(() => import('./routes/week-plan')), errorElement },
  { path: 'calendar', lazy: lazyRoute(() => import('./routes/calendar')), errorElement },
  { path: 'visits', lazy: lazyRoute(() => import('./routes/grower-visits')), errorElement },
  { path: 'reminders', lazy: lazyRoute(() => import('./routes/reminders')), errorElement },
  { path: 'reminders/outbox', lazy: lazyRoute(() => import('./routes/reminders-outbox')), errorElement },
  { path: 'reminders/campaigns/:campaignId', lazy: lazyRoute(() => import('./routes/reminder-campaign')), errorElement },
  { path: 'sent-mail', lazy: lazyRoute(() => import('./routes/sent-mail')), errorElement },
  { path: 'sent-mail/:mailId', lazy: lazyRoute(() => import('./routes/sent-mail-message')), errorElement },
  { path: 'reminder-preferences', lazy: lazyRoute(() => import('./routes/reminder-preferences')), errorElement },
  { path: 'forecast', lazy: lazyRoute(() => import('./routes/forecast')), errorElement },
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
