// The pooled network report: sites in and out, findings, forest plot, response curve, the
// combined ANOVA with its error term, economics with adjustable prices, and filters.
import type { PooledQuery, PooledReport } from '../../../../shared/schemas/report';
import { Alert } from '../../../components/ui/alert';
import { Link } from 'react-router-dom';
import { buttonClasses } from '../../../components/ui/button';
import { PageHeader, type BackTo } from '../../../components/ui/page-header';
import { cn } from '../../../lib/cn';
import { pooledSearch } from '../api/get-pooled-report';
import { usePublishTrial } from '../api/publish-report';
import { FindingsList } from './findings-list';
import { PublishPanel } from './publish-panel';
import { DownloadLink } from './report-bits';
import { FiltersForm, PublicLinkControl } from './pooled-report-controls';
import {
  PooledCurveSection,
  PooledEconomicsSection,
  PooledForestSection,
  PooledModelSections,
  PooledSitesSection,
  PooledStatisticianSection,
} from './pooled-report-sections';

export interface PooledReportViewProps {
  report: PooledReport;
  query: PooledQuery;
  onQuery: (query: PooledQuery) => void;
  /** The public copy: no publishing, no exports, no meeting view link. */
  isPublic?: boolean;
  /** The page this report belongs to (the trial page, or the member's home). */
  back?: BackTo;
  updating?: boolean;
}

export function PooledReportView({
  report,
  query,
  onQuery,
  isPublic = false,
  updating = false,
  back,
}: PooledReportViewProps) {
  const { trial, analysis } = report;
  const publish = usePublishTrial(trial.id);
  return (
    <div className={cn('report-page space-y-8', updating && 'opacity-70 transition-opacity')}>
      <PageHeader
        back={back}
        eyebrow={`Network report · ${[trial.cropName, trial.season].filter(Boolean).join(', ')}`}
        title={trial.name}
        description={trial.question}
        actions={
          isPublic ? null : (
            <>
              <Link
                to={`/trials/${trial.id}/meeting`}
                className={buttonClasses('primary', 'md', 'no-underline no-print')}
              >
                Meeting view
              </Link>
              <DownloadLink
                href={`/api/trials/${trial.id}/pooled-report.pdf${pooledSearch(query)}`}
              >
                PDF
              </DownloadLink>
              {report.canPublish ? (
                <DownloadLink href={`/api/trials/${trial.id}/export.csv`}>Strips CSV</DownloadLink>
              ) : null}
            </>
          )
        }
      />
      {isPublic ? (
        <Alert tone="info">
          A read-only copy of this network’s published report, shared by its coordinator.
        </Alert>
      ) : (
        <PublishPanel
          what="network report"
          published={report.published}
          changed={report.dataChangedSincePublished}
          canPublish={report.canPublish}
          busy={publish.isPending}
          error={publish.error}
          onAction={(action) => publish.mutate(action)}
          lockNote="Publishing stores a snapshot of this analysis (all complete sites, the trial's prices) for members; later data changes will not alter it silently."
        >
          {report.canPublish ? (
            <PublicLinkControl trialId={trial.id} token={report.publicLinkToken} />
          ) : null}
        </PublishPanel>
      )}
      <FiltersForm
        key={`${report.prices.seedPricePerLb}-${report.prices.grainPricePerBu}`}
        report={report}
        query={query}
        onQuery={onQuery}
        isPublic={isPublic}
      />
      <FindingsList title="What the network found" findings={report.findings} />

      <PooledSitesSection report={report} />
      {analysis ? (
        <>
          <PooledForestSection report={report} analysis={analysis} />
          <PooledCurveSection report={report} analysis={analysis} />
          <PooledModelSections report={report} analysis={analysis} />
          <PooledEconomicsSection report={report} analysis={analysis} />
        </>
      ) : (
        <Alert tone="info" title="Not ready for a pooled analysis">
          {report.analysisError}
        </Alert>
      )}
      <PooledStatisticianSection report={report} analysis={analysis} />
    </div>
  );
}
