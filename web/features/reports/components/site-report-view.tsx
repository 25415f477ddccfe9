// The site report: header, findings, charts, tables, missing and odd strips, notes and photos.
import { formatNumber } from '../../../../shared/reports/format-numbers';
import type { SiteReport } from '../../../../shared/schemas/report';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { PageHeader, type BackTo } from '../../../components/ui/page-header';
import { formatDate } from '../../../lib/format';
import { usePublishSite } from '../api/publish-report';
import { FindingsList } from './findings-list';
import { PublishPanel } from './publish-panel';
import { DownloadLink, Facts } from './report-bits';
import {
  SiteChartsSection,
  SiteChecksSection,
  SiteNotesSection,
  SiteNumbersSection,
  SiteStatisticianSection,
} from './site-report-sections';

export function SiteReportView({ report, back }: { report: SiteReport; back?: BackTo }) {
  const { site, analysis } = report;
  const publish = usePublishSite(site.id);
  return (
    <div className="report-page space-y-8">
      <PageHeader
        back={back}
        eyebrow={`Site report · ${site.trialName}`}
        title={site.fieldName}
        description={[site.growerName, [site.cropName, site.season].filter(Boolean).join(', ')]
          .filter(Boolean)
          .join(' · ')}
        actions={
          <>
            <DownloadLink href={`/api/sites/${site.id}/report.pdf`}>PDF</DownloadLink>
            <Button variant="secondary" className="no-print" onClick={() => window.print()}>
              Print
            </Button>
          </>
        }
      />
      <PublishPanel
        what="site report"
        published={report.published}
        changed={report.dataChangedSincePublished}
        canPublish={report.canPublish}
        busy={publish.isPending}
        error={publish.error}
        onAction={(action) => publish.mutate(action)}
        lockNote="Publishing locks this site's strip data, shows the report to network members and e-mails the grower a link."
      />
      <Facts
        items={[
          ['Sown', formatDate(site.dates.sowing)],
          ['Emerged', formatDate(site.dates.emergence)],
          ['Heading', formatDate(site.dates.heading)],
          ['Harvested', formatDate(site.dates.harvest)],
          ['Design', `${site.design.rates.length} rates × ${site.design.blocks} blocks (RCBD)`],
          [
            'Data',
            `${site.completeness.withYield} of ${site.completeness.strips} strips with yield (${formatNumber(site.completeness.percent, 0)} %)`,
          ],
          ['Soil', site.soil],
          ['Previous crop', site.previousCrop],
        ]}
      />
      {site.question ? (
        <p className="text-ink-muted">
          <span className="font-semibold text-ink">The network’s question: </span>
          {site.question}
        </p>
      ) : null}
      <FindingsList findings={report.findings} />

      {analysis ? (
        <>
          <SiteChartsSection report={report} analysis={analysis} />
          <SiteNumbersSection report={report} analysis={analysis} />
          <SiteChecksSection report={report} analysis={analysis} />
        </>
      ) : (
        <Alert tone="info" title="Not ready for analysis">
          {report.analysisError}
        </Alert>
      )}
      <SiteNotesSection report={report} />
      <SiteStatisticianSection report={report} analysis={analysis} />
    </div>
  );
}
