// Shared pieces of the site collect routes: the loader that prefetches a site's strips, the
// loading and error states, and the ErrorBoundary (404 panel, everything else re-thrown).
import type { QueryClient } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { useParams, useRouteError, type LoaderFunctionArgs } from 'react-router-dom';
import type { SiteStrips } from '../../../../shared/schemas/strip';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { LoadingBlock } from '../../../components/ui/spinner';
import { meQueryOptions } from '../../../features/auth/api/get-me';
import { siteStripsQueryOptions, useSiteStrips } from '../../../features/collect/api/site-strips';
import { useOutbox } from '../../../features/collect/lib/outbox';
import { isApiError } from '../../../lib/api-client';
import { errorSummary } from '../../../lib/form-errors';
import { isNotFound, NotFoundPanel } from '../../route-errors';

export const siteStripsLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    // Ask for the strips while the sign-in check is still under way (one round trip, not two on
    // a slow connection); a signed-out visitor's 401 is dropped and the app layout redirects.
    const strips = params.siteId ? siteStripsQueryOptions(params.siteId) : null;
    if (strips) void queryClient.prefetchQuery(strips);
    const user = await queryClient.ensureQueryData(meQueryOptions());
    if (!user || !strips) return null;
    await queryClient.ensureQueryData(strips);
    return null;
  };

/** Renders `children` with the site's strips once loaded. */
export function WithSiteStrips({ children }: { children: (data: SiteStrips) => ReactNode }) {
  const { siteId = '' } = useParams();
  const query = useSiteStrips(siteId);
  useOutbox();
  if (query.data) return <>{children(query.data)}</>;
  if (query.isError) {
    if (isNotFound(query.error)) return <NotFoundPanel title="Site not found" />;
    return (
      <Alert
        tone="danger"
        title="Could not load this site"
        action={
          <Button variant="secondary" onClick={() => void query.refetch()}>
            Try again
          </Button>
        }
      >
        {errorSummary(query.error)}
      </Alert>
    );
  }
  return <LoadingBlock label="Loading strips…" />;
}

export function CollectErrorBoundary() {
  const error = useRouteError();
  if (isNotFound(error)) return <NotFoundPanel title="Site not found" />;
  if (isApiError(error, 403))
    return (
      <NotFoundPanel title="Not your site">
        Only the grower of this site and the trial’s coordinators can enter its numbers.
      </NotFoundPanel>
    );
  throw error;
}
