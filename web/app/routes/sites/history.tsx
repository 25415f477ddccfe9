// `/sites/:siteId/history`: who changed what on this site, in plain words (grower, coordinators).
import { useParams } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { LoadingBlock } from '../../../components/ui/spinner';
import { useSiteHistory } from '../../../features/sites/api/history';
import { PlainHistory } from '../../../features/sites/components/plain-history';
import { SiteHeading } from '../../../features/collect/components/site-heading';
import { isApiError } from '../../../lib/api-client';
import { errorSummary } from '../../../lib/form-errors';
import { CollectErrorBoundary, siteStripsLoader, WithSiteStrips } from './collect-route';

export const clientLoader = siteStripsLoader;
export const ErrorBoundary = CollectErrorBoundary;

function History() {
  const { siteId = '' } = useParams();
  const audit = useSiteHistory(siteId);
  if (audit.data) return <PlainHistory entries={audit.data} />;
  if (audit.isError) {
    if (isApiError(audit.error, 403))
      return (
        <Alert tone="info" title="History is for the site’s grower and coordinators">
          The site’s grower and the trial’s coordinators see who changed which number here.
        </Alert>
      );
    return (
      <Alert tone="danger" title="Could not load the history">
        {errorSummary(audit.error)}
      </Alert>
    );
  }
  return <LoadingBlock label="Loading history…" />;
}

export default function HistoryPage() {
  return (
    <WithSiteStrips>
      {(data) => (
        <>
          <SiteHeading site={data.site} title={`${data.site.fieldName}: history`} />
          <History />
        </>
      )}
    </WithSiteStrips>
  );
}
