// `/sites/:siteId`: a site's strips by block with what is recorded and missing, and its dates.
import { Link } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { SiteDatesForm } from '../../../features/collect/components/site-dates-form';
import { SiteHeading } from '../../../features/collect/components/site-heading';
import { StripList } from '../../../features/collect/components/strip-list';
import { NamingChoice } from '../../../features/sites/components/naming-choice';
import { useStagesAfterFirstPaint } from '../../../lib/use-after-first-paint';
import type { SiteContext } from '../../../../shared/schemas/strip';
import { CollectErrorBoundary, siteStripsLoader, WithSiteStrips } from './collect-route';

export const clientLoader = siteStripsLoader;
export const ErrorBoundary = CollectErrorBoundary;

export default function SitePage() {
  // The page is built in three renders, so no single task on a slow phone builds all of it: the
  // first block of strips; then the other blocks; then the dates, naming and links column (below
  // the list on a phone).
  const stage = useStagesAfterFirstPaint(2);
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
            <StripList data={data} restShown={stage >= 1} />
            {stage >= 2 ? <SiteSideColumn site={data.site} /> : null}
          </div>
        </>
      )}
    </WithSiteStrips>
  );
}

/** The site's dates, how reports name the farm, and links to the site's other pages. */
function SiteSideColumn({ site }: { site: SiteContext }) {
  return (
    <div className="space-y-4">
      <Card>
        <SiteDatesForm key={site.dataVersion} site={site} />
      </Card>
      <NamingChoice siteId={site.siteId} />
      <Card>
        <h2 className="text-heading text-ink">This site</h2>
        <ul className="mt-2 flex flex-col">
          {[
            { to: `/sites/${site.siteId}/map`, label: 'Strip map' },
            { to: `/sites/${site.siteId}/packet`, label: 'Field packet' },
            { to: `/sites/${site.siteId}/report`, label: 'Site report' },
            { to: `/sites/${site.siteId}/history`, label: 'What changed, and who' },
            { to: '/calibrate?site=' + site.siteId, label: 'Calibrate the seeder' },
            ...(site.isCoordinator
              ? [
                  {
                    to: `/trials/${site.trialId}/progress`,
                    label: 'Progress across the trial',
                  },
                ]
              : []),
          ].map((item) => (
            <li key={item.to}>
              <Link
                to={item.to}
                className="inline-flex min-h-11 items-center rounded-field px-3 text-label font-semibold text-accent no-underline hover:bg-accent-soft"
              >
                {item.label}
              </Link>
            </li>
          ))}
        </ul>
      </Card>
    </div>
  );
}
