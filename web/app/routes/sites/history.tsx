// `/sites/:siteId/history`: who changed what on this site (coordinators).
import { useParams } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { LoadingBlock } from '../../../components/ui/spinner';
import { useSiteAudit } from '../../../features/collect/api/site-audit';
import { HistoryList } from '../../../features/collect/components/history-list';
import { SiteHeading } from '../../../features/collect/components/site-heading';
import { isApiError } from '../../../lib/api-client';
import { errorSummary } from '../../../lib/form-errors';
import { CollectErrorBoundary, siteStripsLoader, WithSiteStrips } from './collect-route';

export const clientLoader = siteStripsLoader;
export const ErrorBoundary = CollectErrorBoundary;

function History() {
  const { siteId = '' } = useParams();
  const audit = useSiteAudit(siteId);
  if (audit.data) return <HistoryList events={audit.data} />;
  if (audit.isError) {
    if (isApiError(audit.error, 403))
      return (
        <Alert tone="info" title="History is for coordinators">
          The trial’s coordinators see who changed which number here.
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
