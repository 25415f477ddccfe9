// `/sites/:siteId/strips/:stripId`: one strip's form, made for a phone in the field.
import { useParams } from 'react-router-dom';
import { SiteHeading } from '../../../features/collect/components/site-heading';
import { StripForm } from '../../../features/collect/components/strip-form';
import { NotFoundPanel } from '../../route-errors';
import { CollectErrorBoundary, siteStripsLoader, WithSiteStrips } from './collect-route';

export const clientLoader = siteStripsLoader;
export const ErrorBoundary = CollectErrorBoundary;

export default function StripPage() {
  const { stripId } = useParams();
  return (
    <WithSiteStrips>
      {(data) => {
        const strip = data.strips.find((s) => s.stripId === stripId);
        if (!strip) return <NotFoundPanel title="Strip not found" />;
        return (
          <>
            <SiteHeading
              site={data.site}
              back={{
                to: `/sites/${data.site.siteId}`,
                label: `All strips of ${data.site.fieldName}`,
              }}
              title={`Plot ${strip.plotNumber}`}
              description={`Block ${strip.block}, strip ${strip.position} · ${strip.label} rate (${strip.rate}× the reference) · ${data.site.fieldName}`}
            />
            <StripForm key={strip.stripId} data={data} strip={strip} />
          </>
        );
      }}
    </WithSiteStrips>
  );
}
