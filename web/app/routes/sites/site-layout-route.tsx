// Shared pieces of the site map and packet routes: the loader that prefetches the site and its
// strip layout, a hook that waits for both, the link back, and the ErrorBoundary (404 panel).
import type { QueryClient } from '@tanstack/react-query';
import { useParams, useRouteError, type LoaderFunctionArgs } from 'react-router-dom';
import type { SiteDetail } from '../../../../shared/schemas/site';
import {
  layoutQueryOptions,
  siteQueryOptions,
  useLayout,
  useSite,
} from '../../../lib/queries/sites';
import { isNotFound, NotFoundPanel } from '../../route-errors';

export const siteLayoutLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    await Promise.all([
      queryClient.ensureQueryData(siteQueryOptions(params.siteId!)),
      queryClient.ensureQueryData(layoutQueryOptions(params.siteId!)),
    ]);
    return null;
  };

/** The route's site and its strip layout, or null until both have loaded. */
export function useSiteWithLayout() {
  const { siteId } = useParams();
  const site = useSite(siteId!);
  const layout = useLayout(siteId!);
  if (!site.data || !layout.data) return null;
  return { site: site.data, layout: layout.data };
}

/** Where "back" leads: the trial for its coordinators, the site page for its grower. */
export function siteBackLink(site: SiteDetail) {
  return site.canCoordinate
    ? { to: `/trials/${site.trialId}`, label: site.trial.name }
    : { to: `/sites/${site.id}`, label: site.fieldName };
}

export function SiteLayoutErrorBoundary() {
  const error = useRouteError();
  if (!isNotFound(error)) throw error;
  return <NotFoundPanel title="No such site" />;
}
