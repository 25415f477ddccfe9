// `/sites/:siteId/map`: the site's strip map on its own, with a link to the printable packet.
import { ButtonLink } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingBlock } from '../../../components/ui/spinner';
import { StripMap } from '../../../features/packets/components/strip-map';
import {
  siteBackLink,
  SiteLayoutErrorBoundary,
  siteLayoutLoader,
  useSiteWithLayout,
} from './site-layout-route';

export const clientLoader = siteLayoutLoader;
export const ErrorBoundary = SiteLayoutErrorBoundary;

export default function SiteMapPage() {
  const loaded = useSiteWithLayout();
  if (!loaded) return <LoadingBlock />;
  const { site, layout } = loaded;
  return (
    <>
      <PageHeader
        back={siteBackLink(site)}
        eyebrow={site.trial.name}
        title={`Strip map: ${site.fieldName}`}
        description={`${site.trial.blocksPerSite ?? '?'} blocks, each with every rate once in its own random order.`}
        actions={
          site.randomized ? (
            <ButtonLink to={`/sites/${site.id}/packet`}>Field packet</ButtonLink>
          ) : null
        }
      />
      {site.randomized ? (
        <StripMap layout={layout} title={`Strip map for ${site.fieldName}`} />
      ) : (
        <EmptyState title="Not randomized yet">
          The coordinator draws the map from the trial page.
        </EmptyState>
      )}
    </>
  );
}
