// The root route: renders the matched page, and catches whatever a page's boundary re-throws.
import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { Navigate, Outlet, ScrollRestoration, useLocation, useRouteError } from 'react-router-dom';
import type { SessionUser } from '../../../shared/schemas/auth';
import { Alert } from '../../components/ui/alert';
import { Button } from '../../components/ui/button';
import { Spinner } from '../../components/ui/spinner';
import { meQueryKey } from '../../features/auth/api/get-me';
import { isApiError } from '../../lib/api-client';
import { errorSummary } from '../../lib/form-errors';
import { signInPath } from '../../lib/redirects';
import { AppShell } from '../layout/app-shell';
import { isNotFound, NotFoundPanel } from '../route-errors';

export function RootLayout() {
  return (
    <>
      <Outlet />
      <ScrollRestoration />
    </>
  );
}

/** The same as index.html's loading view: a ring named for screen readers, no painted words. */
export function RootHydrateFallback() {
  return (
    <div className="flex min-h-dvh items-center justify-center">
      <div role="status" aria-label="Opening Sheaf…" className="py-12 text-accent">
        <Spinner size="md" label="" />
      </div>
    </div>
  );
}

function SessionEnded() {
  const queryClient = useQueryClient();
  const location = useLocation();
  useEffect(() => {
    queryClient.setQueryData(meQueryKey, null);
  }, [queryClient]);
  return <Navigate to={signInPath(location)} replace />;
}

export function RootErrorBoundary() {
  const error = useRouteError();
  const queryClient = useQueryClient();
  const user = queryClient.getQueryData<SessionUser | null>(meQueryKey) ?? null;

  // The session ran out while the page was open: sign in again and come back here.
  if (isApiError(error, 401)) return <SessionEnded />;

  if (isNotFound(error)) {
    return (
      <AppShell user={user}>
        <NotFoundPanel />
      </AppShell>
    );
  }

  if (import.meta.env.DEV) console.error(error);
  const forbidden = isApiError(error, 403);
  return (
    <AppShell user={user}>
      <div className="mx-auto max-w-prose space-y-4 py-6">
        <h1 className="text-title text-ink">
          {forbidden ? 'This page is not open to you' : 'Something went wrong'}
        </h1>
        <Alert tone={forbidden ? 'caution' : 'danger'}>
          {forbidden
            ? 'Your role in this network does not include this page. Ask your coordinator if you need it.'
            : errorSummary(error)}
        </Alert>
        <div className="flex flex-wrap gap-2">
          <Button onClick={() => window.location.reload()}>Try again</Button>
          <Button variant="secondary" onClick={() => window.location.assign('/')}>
            Back to home
          </Button>
        </div>
      </div>
    </AppShell>
  );
}
