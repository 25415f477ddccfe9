// `/sites/:siteId`: a site's strips by block with what is recorded and missing, and its dates.
import { Link } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { SiteDatesForm } from '../../../features/collect/components/site-dates-form';
import { SiteHeading } from '../../../features/collect/components/site-heading';
import { StripList } from '../../../features/collect/components/strip-list';
import { CollectErrorBoundary, siteStripsLoader, WithSiteStrips } from './collect-route';

export const clientLoader = siteStripsLoader;
export const ErrorBoundary = CollectErrorBoundary;

export default function SitePage() {
  return (
    <WithSiteStrips>
      {(data) => (
        <>
          <SiteHeading
            site={data.site}
            description={
              data.site.canEdit
                ? 'Tap a strip to enter its counts and weights. Changes are kept on this phone and sent when there is signal.'
                : 'The numbers entered for each strip.'
            }
          />
          <div className="grid gap-6 lg:grid-cols-[1fr_20rem]">
            <StripList data={data} />
            <div className="space-y-4">
              <Card>
                <SiteDatesForm key={data.site.dataVersion} site={data.site} />
              </Card>
              {data.site.isCoordinator ? (
                <p className="text-label">
                  <Link to={`/trials/${data.site.trialId}/progress`}>Progress across the trial →</Link>
                </p>
              ) : null}
            </div>
          </div>
        </>
      )}
    </WithSiteStrips>
  );
}
