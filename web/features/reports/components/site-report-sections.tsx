// The site report's sections, each its own component taking the whole report, so a new section
// is one component and one line in SiteReportView.
import { useCallback, useMemo } from 'react';
import {
  componentsSpec,
  rateMeansSpec,
  stripMapSpec,
} from '../../../../shared/reports/chart-specs';
import { rateName, siteComparisons } from '../../../../shared/reports/findings';
import { outlierSentence } from '../../../../shared/reports/plain-words';
import { decimalsFor, formatNumber } from '../../../../shared/reports/format-numbers';
import type { SiteReport } from '../../../../shared/schemas/report';
import { ChartCard, Section } from './report-bits';
import {
  AnovaTable,
  ComponentsTable,
  DifferencesDetailTable,
  MeansTable,
  PlainDifferencesTable,
} from './report-tables';
import { StatisticianBlock, StatisticianPart } from './statistician-notes';
import { VegaChart } from './vega-chart';

export interface SiteReportSectionProps {
  report: SiteReport;
}

type Analysis = NonNullable<SiteReport['analysis']>;

/** Rate key → the label the coordinator gave it. */
export function useRateLabel(report: SiteReport) {
  const rates = report.site.design.rates;
  return useMemo(() => {
    const labels = new Map(rates.map((r) => [r.key, r.label]));
    return (rate: string) => labels.get(rate) ?? rate;
  }, [rates]);
}

export function SiteChartsSection({
  report,
  analysis,
}: SiteReportSectionProps & { analysis: Analysis }) {
  const label = useRateLabel(report);
  const unit = report.site.units.yield;
  const meansSpec = useMemo(
    () =>
      rateMeansSpec({
        means: analysis.means.map((m) => ({
          label: label(m.rate),
          mean: m.mean,
          ciLow: m.ciLow,
          ciHigh: m.ciHigh,
        })),
        strips: report.strips.map((s) => ({ label: s.label, yield: s.yield, block: s.block })),
        yieldUnit: unit,
      }),
    [analysis, report.strips, unit, label],
  );
  const mapSpec = useMemo(
    () => stripMapSpec({ strips: report.strips, yieldUnit: unit }),
    [report.strips, unit],
  );
  const rows = report.components.byRate;
  // Three panels side by side when there is room, stacked on a phone; redrawn on resize.
  const partsSpec = useCallback(
    (width: number) => {
      const columns = width < 560 ? 1 : 3;
      const panelWidth = Math.floor((width - 70 * columns) / columns);
      return componentsSpec({ rows }, { columns, panelWidth });
    },
    [rows],
  );
  const hasComponents = report.components.byRate.some(
    (c) => c.plantsPerSquareFoot !== null || c.headsPerSquareFoot !== null,
  );
  return (
    <Section
      id="charts"
      title="Yield by seeding rate"
      intro="Filled dots are rate means with their 95 % intervals (each rate on its own); open circles are the individual strips."
    >
      <div className="grid gap-4 lg:grid-cols-2">
        <ChartCard>
          <VegaChart
            spec={meansSpec}
            title="Rate means"
            description={`Mean yield (${unit}) by rate with 95 % intervals (each rate on its own) and each strip.`}
          />
        </ChartCard>
        <ChartCard>
          <VegaChart
            spec={mapSpec}
            title="Strip map"
            description="The strips as laid out in the field, coloured by yield: blocks from the start edge down, strips in sowing order, as on the field packet’s map."
          />
        </ChartCard>
      </div>
      {hasComponents ? (
        <ChartCard>
          <VegaChart
            specForWidth={partsSpec}
            title="Yield components"
            description="Plants, tillers and heads by rate: thin stands often make up with more tillers."
          />
        </ChartCard>
      ) : null}
    </Section>
  );
}

export function SiteNumbersSection({
  report,
  analysis,
}: SiteReportSectionProps & { analysis: Analysis }) {
  const label = useRateLabel(report);
  const { site } = report;
  const unit = site.units.yield;
  const digits = decimalsFor(analysis.grandMean);
  const comparisons = siteComparisons(analysis, (rate) => rateName(label(rate)));
  return (
    <Section
      id="tables"
      title="The numbers"
      intro={`Average over every strip ${formatNumber(analysis.grandMean, digits)} ${unit}. A rate “clearly” differs from the ${rateName(label(site.design.reference))} only when its whole interval in the difference table is on one side of zero; those intervals are Dunnett-adjusted: they allow for comparing every rate with it at once.`}
    >
      <MeansTable means={analysis.means} label={label} unit={unit} digits={digits} />
      <PlainDifferencesTable
        comparisons={comparisons}
        rates={analysis.differences.map((d) => d.rate)}
        label={label}
        referenceLabel={label(site.design.reference)}
        unit={unit}
        digits={digits}
      />
      <ComponentsTable
        rows={report.components.byRate}
        seedUnit={site.units.seed}
        yieldUnit={unit}
        moneyUnit={site.units.money}
        digits={digits}
      />
    </Section>
  );
}

export function SiteChecksSection({
  report,
  analysis,
}: SiteReportSectionProps & { analysis: Analysis }) {
  const label = useRateLabel(report);
  const unit = report.site.units.yield;
  const digits = decimalsFor(analysis.grandMean);
  if (analysis.missing === 0 && analysis.outliers.length === 0) return null;
  return (
    <Section id="checks" title="Missing and unusual strips">
      <ul className="space-y-2 text-ink">
        {analysis.missingEstimates.map((m) => (
          <li key={`m-${m.block}-${m.rate}`}>
            Block {m.block}, {rateName(label(m.rate))}: no yield. The analysis used an estimate of{' '}
            {formatNumber(m.estimate, digits)} {unit} from the rest of the site, which makes the
            comparisons a little less certain.
          </li>
        ))}
        {analysis.outliers.map((o) => (
          <li key={`o-${o.block}-${o.rate}`}>
            {outlierSentence(
              {
                block: o.block,
                rate: rateName(label(o.rate)),
                value: o.value,
                pBonferroni: o.pBonferroni,
              },
              { unit, digits, scope: 'site' },
            )}
          </li>
        ))}
      </ul>
    </Section>
  );
}

/** The ANOVA, the means with Tukey letters, both kinds of p and the residual checks. */
export function SiteStatisticianSection({
  report,
  analysis,
}: SiteReportSectionProps & { analysis: Analysis | null }) {
  const label = useRateLabel(report);
  const { site } = report;
  const unit = site.units.yield;
  if (!analysis) return <StatisticianPart notes={report.forStatistician} />;
  const digits = decimalsFor(analysis.grandMean);
  return (
    <StatisticianPart notes={report.forStatistician ?? analysis.notes}>
      <AnovaTable anova={analysis.anova} digits={digits} />
      <StatisticianBlock
        title="Rate means and differences in full"
        intro={`LSD (5 %) ${formatNumber(analysis.lsd, digits)}; Tukey HSD ${formatNumber(analysis.hsd, digits)}. Rates sharing a Tukey group letter are not detectably different by Tukey’s test.`}
      >
        <MeansTable
          means={analysis.means}
          label={label}
          unit={unit}
          digits={digits}
          details
          caption="Rate means with standard errors and Tukey groups"
        />
        <DifferencesDetailTable
          differences={analysis.differences}
          label={label}
          referenceLabel={label(site.design.reference)}
          unit={unit}
          digits={digits}
        />
      </StatisticianBlock>
    </StatisticianPart>
  );
}

export function SiteNotesSection({ report }: SiteReportSectionProps) {
  const { site, photos } = report;
  const stripNotes = report.strips.filter((s) => s.notes.trim() !== '');
  if (!site.notes && stripNotes.length === 0 && photos.length === 0) return null;
  return (
    <Section id="notes" title="Notes and photos from the field">
      {site.notes ? <p className="max-w-prose whitespace-pre-line text-ink">{site.notes}</p> : null}
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
      {photos.length > 0 ? (
        <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4">
          {photos.map((photo) => (
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
  );
}
