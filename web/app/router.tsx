// Feature routes are added below by each feature folder: append a lazy route module to
// `appRoutes` (signed-in pages inside the app shell), e.g.
//   { path: 'trials/:trialId', lazy: routeModule(() => import('./routes/trials/trial')) },
// A route module exports a default component, and optionally `clientLoader(queryClient)`
// (prefetch with queryClient.ensureQueryData) and an `ErrorBoundary` (404 here, re-throw the rest).
// Loaders of nested routes run in parallel with the app layout's sign-in guard: a page loader
// returns early when there is no user rather than redirecting itself.
import type { QueryClient } from '@tanstack/react-query';
import type { ComponentType } from 'react';
import {
  createBrowserRouter,
  RouterProvider,
  type LoaderFunction,
  type RouteObject,
} from 'react-router-dom';
import { queryClient } from '../lib/query-client';
import { RootErrorBoundary, RootHydrateFallback, RootLayout } from './routes/root';

export interface RouteModule {
  default: ComponentType;
  clientLoader?: (queryClient: QueryClient) => LoaderFunction;
  ErrorBoundary?: ComponentType;
}

/** Turns a route module import into React Router's `lazy`, so each page is its own chunk. */
export function routeModule(load: () => Promise<RouteModule>) {
  return async () => {
    const module = await load();
    return {
      Component: module.default,
      loader: module.clientLoader?.(queryClient),
      ErrorBoundary: module.ErrorBoundary,
    };
  };
}

/** Signed-in pages, rendered inside the app shell. */
export const appRoutes: RouteObject[] = [
  { index: true, lazy: routeModule(() => import('./routes/app/home')) },
  { path: 'admin/mail', lazy: routeModule(() => import('./routes/admin/mail')) },
  { path: 'people', lazy: routeModule(() => import('./routes/people/people')) },
  { path: 'networks/new', lazy: routeModule(() => import('./routes/networks/new-network')) },
  { path: 'network', lazy: routeModule(() => import('./routes/networks/network-settings')) },
  { path: 'sites/:siteId', lazy: routeModule(() => import('./routes/sites/site')) },
  {
    path: 'sites/:siteId/strips/:stripId',
    lazy: routeModule(() => import('./routes/sites/strip')),
  },
  { path: 'sites/:siteId/grid', lazy: routeModule(() => import('./routes/sites/grid')) },
  { path: 'sites/:siteId/import', lazy: routeModule(() => import('./routes/sites/import')) },
  { path: 'sites/:siteId/photos', lazy: routeModule(() => import('./routes/sites/photos')) },
  { path: 'sites/:siteId/history', lazy: routeModule(() => import('./routes/sites/history')) },
  { path: 'trials/:trialId/progress', lazy: routeModule(() => import('./routes/trials/progress')) },
  { path: 'sites/:siteId/report', lazy: routeModule(() => import('./routes/reports/site-report')) },
  {
    path: 'trials/:trialId/report',
    lazy: routeModule(() => import('./routes/reports/pooled-report')),
  },
  { path: 'trials/new', lazy: routeModule(() => import('./routes/trials/new')) },
  { path: 'trials/:trialId', lazy: routeModule(() => import('./routes/trials/trial')) },
  { path: 'trials/:trialId/edit', lazy: routeModule(() => import('./routes/trials/edit')) },
  { path: 'sites/:siteId/map', lazy: routeModule(() => import('./routes/sites/map')) },
  { path: 'sites/:siteId/packet', lazy: routeModule(() => import('./routes/sites/packet')) },
  { path: 'series', lazy: routeModule(() => import('./routes/series/series-list')) },
  { path: 'series/:seriesId', lazy: routeModule(() => import('./routes/series/series')) },
  { path: '*', lazy: routeModule(() => import('./routes/app/not-found')) },
];

/** Pages for signed-out people: sign in, password reset, invitations. */
const authRoutes: RouteObject[] = [
  { path: 'sign-in', lazy: routeModule(() => import('./routes/auth/sign-in')) },
  { path: 'reset', lazy: routeModule(() => import('./routes/auth/request-reset')) },
  { path: 'reset/:token', lazy: routeModule(() => import('./routes/auth/new-password')) },
  { path: 'invite/:token', lazy: routeModule(() => import('./routes/auth/accept-invitation')) },
  { path: 'sign-up', lazy: routeModule(() => import('./routes/auth/sign-up')) },
  {
    path: 'sign-up/confirm/:token',
    lazy: routeModule(() => import('./routes/auth/confirm-sign-up')),
  },
];

/** Pages anyone may read, signed in or not. */
const openRoutes: RouteObject[] = [
  { path: 'cautions', lazy: routeModule(() => import('./routes/public/cautions')) },
  { path: 'calculator', lazy: routeModule(() => import('./routes/calculator/calculator')) },
  { path: 'calibrate', lazy: routeModule(() => import('./routes/sites/calibrate')) },
  { path: 'shared/:token', lazy: routeModule(() => import('./routes/reports/shared-report')) },
];

export const routes: RouteObject[] = [
  {
    id: 'root',
    Component: RootLayout,
    ErrorBoundary: RootErrorBoundary,
    HydrateFallback: RootHydrateFallback,
    children: [
      { lazy: routeModule(() => import('./routes/auth/layout')), children: authRoutes },
      { lazy: routeModule(() => import('./routes/public/layout')), children: openRoutes },
      // Full-screen slides for a projector: no app shell around them.
      {
        path: 'trials/:trialId/meeting',
        lazy: routeModule(() => import('./routes/reports/meeting')),
      },
      { id: 'app', lazy: routeModule(() => import('./routes/app/layout')), children: appRoutes },
    ],
  },
];

const router = createBrowserRouter(routes);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
