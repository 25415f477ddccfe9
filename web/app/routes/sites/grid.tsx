// `/sites/:siteId/grid`: every strip of the site in one keyboard-driven grid.
import { SiteHeading } from '../../../features/collect/components/site-heading';
import { StripGrid } from '../../../features/collect/components/strip-grid';
import { CollectErrorBoundary, siteStripsLoader, WithSiteStrips } from './collect-route';

export const clientLoader = siteStripsLoader;
export const ErrorBoundary = CollectErrorBoundary;

export default function GridPage() {
  return (
    <WithSiteStrips>
      {(data) => (
        <>
          <SiteHeading site={data.site} title={`${data.site.fieldName}: all strips`} />
          <StripGrid data={data} />
        </>
      )}
    </WithSiteStrips>
  );
}
