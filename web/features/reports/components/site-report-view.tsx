// The site report: header, findings, charts, tables, missing and odd strips, notes and photos.
import { useMemo } from 'react';
import {
  rateMeansSpec,
  componentsSpec,
  stripMapSpec,
} from '../../../../shared/reports/chart-specs';
import { rateName } from '../../../../shared/reports/findings';
import { decimalsFor, formatNumber } from '../../../../shared/reports/format-numbers';
import type { SiteReport } from '../../../../shared/schemas/report';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { PageHeader, type BackTo } from '../../../components/ui/page-header';
import { formatDate } from '../../../lib/format';
import { usePublishSite } from '../api/publish-report';
import { FindingsList } from './findings-list';
import { PublishPanel } from './publish-panel';
import { ChartCard, DownloadLink, Facts, Section } from './report-bits';
import { AnovaTable, ComponentsTable, DifferencesTable, MeansTable } from './report-tables';
import { VegaChart } from './vega-chart';

export function SiteReportView({ report, back }: { report: SiteReport; back?: BackTo }) {
  const { site, analysis } = report;
  const publish = usePublishSite(site.id);
  const unit = site.units.yield;
  const digits = decimalsFor(analysis?.grandMean ?? 50);
  const labelOf = useMemo(
    () => new Map(site.design.rates.map((r) => [r.key, r.label])),
    [site.design.rates],
  );
  const label = (rate: string) => labelOf.get(rate) ?? rate;
  const referenceLabel = label(site.design.reference);

  const meansSpec = useMemo(
    () =>
      analysis
        ? rateMeansSpec({
            means: analysis.means.map((m) => ({
              label: label(m.rate),
              mean: m.mean,
              ciLow: m.ciLow,
              ciHigh: m.ciHigh,
            })),
            strips: report.strips.map((s) => ({ label: s.label, yield: s.yield, block: s.block })),
            yieldUnit: unit,
          })
        : null,
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [report],
  );
  const mapSpec = useMemo(
    () => stripMapSpec({ strips: report.strips, yieldUnit: unit }),
    [report.strips, unit],
  );
  const narrow = typeof window !== 'undefined' && window.innerWidth < 640;
  const partsSpec = useMemo(
    () =>
      componentsSpec(
        { rows: report.components.byRate },
        { columns: narrow ? 1 : 3, panelWidth: narrow ? 250 : 200 },
      ),
    [report.components.byRate, narrow],
  );
  const hasComponents = report.components.byRate.some(
    (c) => c.plantsPerSquareFoot !== null || c.headsPerSquareFoot !== null,
  );
  const stripNotes = report.strips.filter((s) => s.notes.trim() !== '');

  return (
    <div className="space-y-8">
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

      {analysis && meansSpec ? (
        <>
          <Section
            id="charts"
            title="Yield by seeding rate"
            intro="Filled dots are rate means with their 95 % confidence intervals; open circles are the individual strips."
          >
            <div className="grid gap-4 lg:grid-cols-2">
              <ChartCard>
                <VegaChart
                  spec={meansSpec}
                  title="Rate means"
                  description={`Mean yield (${unit}) by rate with 95 % confidence intervals and each strip.`}
                />
              </ChartCard>
              <ChartCard>
                <VegaChart
                  spec={mapSpec}
                  title="Strip map"
                  description="The strips as laid out in the field, coloured by yield."
                />
              </ChartCard>
            </div>
            {hasComponents ? (
              <ChartCard>
                <VegaChart
                  spec={partsSpec}
                  title="Yield components"
                  description="Plants, tillers and heads by rate: thin stands often make up with more tillers."
                />
              </ChartCard>
            ) : null}
          </Section>
          <Section
            id="tables"
            title="The numbers"
            intro={`Grand mean ${formatNumber(analysis.grandMean, digits)} ${unit}; CV ${formatNumber(analysis.cvPercent, 1)} %; LSD (5 %) ${formatNumber(analysis.lsd, digits)}; Tukey HSD ${formatNumber(analysis.hsd, digits)}. Rates sharing a group letter are not detectably different (Tukey).`}
          >
            <AnovaTable anova={analysis.anova} digits={digits} />
            <div className="grid gap-4 lg:grid-cols-2">
              <MeansTable means={analysis.means} label={label} unit={unit} digits={digits} />
              <DifferencesTable
                differences={analysis.differences}
                label={label}
                referenceLabel={referenceLabel}
                unit={unit}
                digits={digits}
              />
            </div>
            <ComponentsTable
              rows={report.components.byRate}
              seedUnit={site.units.seed}
              yieldUnit={unit}
              moneyUnit={site.units.money}
              digits={digits}
            />
          </Section>
          {analysis.missing > 0 || analysis.outliers.length > 0 || analysis.notes.length > 0 ? (
            <Section id="checks" title="Missing and unusual strips">
              <ul className="space-y-2 text-ink">
                {analysis.missingEstimates.map((m) => (
                  <li key={`m-${m.block}-${m.rate}`}>
                    Block {m.block}, {rateName(label(m.rate))}: no yield. The analysis used an
                    estimate of {formatNumber(m.estimate, digits)} {unit} from the rest of the site,
                    and lost one degree of freedom for it.
                  </li>
                ))}
                {analysis.outliers.map((o) => (
                  <li key={`o-${o.block}-${o.rate}`}>
                    Block {o.block}, {rateName(label(o.rate))}: {formatNumber(o.value, digits)}{' '}
                    {unit} is far from what its block and rate predict (studentized residual{' '}
                    {formatNumber(o.studentized, 1)}). It is kept in the analysis; check the weight
                    and area.
                  </li>
                ))}
                {analysis.notes.map((note, i) => (
                  <li key={`n-${i}`} className="text-ink-muted">
                    {note}
                  </li>
                ))}
              </ul>
            </Section>
          ) : null}
        </>
      ) : (
        <Alert tone="info" title="Not ready for analysis">
          {report.analysisError}
        </Alert>
      )}

      {site.notes || stripNotes.length > 0 || report.photos.length > 0 ? (
        <Section id="notes" title="Notes and photos from the field">
          {site.notes ? (
            <p className="max-w-prose whitespace-pre-line text-ink">{site.notes}</p>
          ) : null}
          {stripNotes.length > 0 ? (
            <ul className="space-y-1 text-label text-ink">
              {stripNotes.map((s) => (
                <li key={s.id}>
                  <span className="font-semibold">
                    Block {s.block}, strip {s.position} ({s.label}):
                  </span>{' '}
                  {s.notes}
                </li>
              ))}
            </ul>
          ) : null}
          {report.photos.length > 0 ? (
            <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4">
              {report.photos.map((photo) => (
                <li
                  key={photo.id}
                  className="overflow-hidden rounded-card border border-line bg-surface"
                >
                  <img
                    src={`${photo.url}?size=thumbnail`}
                    alt={photo.caption || 'Photo from the field'}
                    loading="lazy"
                    className="aspect-[4/3] w-full object-cover"
                  />
                  {photo.caption ? (
                    <p className="p-2 text-caption text-ink-muted">{photo.caption}</p>
                  ) : null}
                </li>
              ))}
            </ul>
          ) : null}
        </Section>
      ) : null}
    </div>
  );
}
