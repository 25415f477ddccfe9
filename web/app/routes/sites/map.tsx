// `/sites/:siteId/map`: the site's strip map on its own, with a link to the printable packet.
import type { QueryClient } from '@tanstack/react-query';
import { useParams, useRouteError, type LoaderFunctionArgs } from 'react-router-dom';
import { ButtonLink } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingBlock } from '../../../components/ui/spinner';
import {
  layoutQueryOptions,
  siteQueryOptions,
  useLayout,
  useSite,
} from '../../../features/packets/api/get-site';
import { StripMap } from '../../../features/packets/components/strip-map';
import { isNotFound, NotFoundPanel } from '../../route-errors';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    await Promise.all([
      queryClient.ensureQueryData(siteQueryOptions(params.siteId!)),
      queryClient.ensureQueryData(layoutQueryOptions(params.siteId!)),
    ]);
    return null;
  };

export default function SiteMapPage() {
  const { siteId } = useParams();
  const site = useSite(siteId!);
  const layout = useLayout(siteId!);
  if (!site.data || !layout.data) return <LoadingBlock />;
  return (
    <>
      <PageHeader
        back={
          site.data.canCoordinate
            ? { to: `/trials/${site.data.trialId}`, label: site.data.trial.name }
            : { to: `/sites/${site.data.id}`, label: site.data.fieldName }
        }
        eyebrow={site.data.trial.name}
        title={`Strip map: ${site.data.fieldName}`}
        description={`${site.data.trial.blocksPerSite ?? '?'} blocks, each with every rate once in its own random order.`}
        actions={
          site.data.randomized ? (
            <ButtonLink to={`/sites/${site.data.id}/packet`}>Field packet</ButtonLink>
          ) : null
        }
      />
      {site.data.randomized ? (
        <StripMap layout={layout.data} title={`Strip map for ${site.data.fieldName}`} />
      ) : (
        <EmptyState title="Not randomized yet">
          The coordinator draws the map from the trial page.
        </EmptyState>
      )}
    </>
  );
}

export function ErrorBoundary() {
  const error = useRouteError();
  if (!isNotFound(error)) throw error;
  return <NotFoundPanel title="No such site" />;
}
