// `/sites/:siteId/import`: CSV template, preview with row errors, and upload.
import { ImportPanel } from '../../../features/collect/components/import-panel';
import { SiteHeading } from '../../../features/collect/components/site-heading';
import { CollectErrorBoundary, siteStripsLoader, WithSiteStrips } from './collect-route';

export const clientLoader = siteStripsLoader;
export const ErrorBoundary = CollectErrorBoundary;

export default function ImportPage() {
  return (
    <WithSiteStrips>
      {(data) => (
        <>
          <SiteHeading site={data.site} title={`${data.site.fieldName}: upload a CSV`} />
          <ImportPanel data={data} />
        </>
      )}
    </WithSiteStrips>
  );
}
