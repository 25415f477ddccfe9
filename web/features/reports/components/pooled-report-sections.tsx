// The pooled report's sections, each its own component taking the report and its analysis, so
// a new section is one component and one line in PooledReportView.
import { useMemo, useState } from 'react';
import {
  forestSpec,
  pooledMeansSpec,
  responseCurveSpec,
} from '../../../../shared/reports/chart-specs';
import { rateName } from '../../../../shared/reports/findings';
import {
  decimalsFor,
  formatNumber,
  formatP,
  squaredDecimals,
} from '../../../../shared/reports/format-numbers';
import type { PooledReport } from '../../../../shared/schemas/report';
import { pricesInWords, reportDisplayUnits } from '../../../../shared/units/report-units';
import { Badge } from '../../../components/ui/badge';
import { DataTable } from '../../../components/ui/data-table';
import { cn } from '../../../lib/cn';
import { ChartCard, DataTableNote, Section } from './report-bits';
import {
  AnovaTable,
  DifferencesDetailTable,
  DifferencesTable,
  EconomicsTable,
  MeansTable,
} from './report-tables';
import { MixedModelSection } from './mixed-model-section';
import { ResponseModelsSection } from './response-models-section';
import { StatisticianBlock, StatisticianPart } from './statistician-notes';
import { VegaChart } from './vega-chart';

export interface PooledSectionProps {
  report: PooledReport;
}
type Analysis = NonNullable<PooledReport['analysis']>;
export interface PooledAnalysisSectionProps extends PooledSectionProps {
  analysis: Analysis;
}

/** Rate key → its label, and the reference rate's label. */
export function usePooledLabels(report: PooledReport) {
  const rates = report.trial.rates;
  return useMemo(() => {
    const labels = new Map(rates.map((r) => [r.key, r.label]));
    const label = (rate: string) => labels.get(rate) ?? rate;
    return { label, referenceLabel: label(report.trial.reference) };
  }, [rates, report.trial.reference]);
}

export function PooledSitesSection({ report }: PooledSectionProps) {
  return (
    <Section
      id="sites"
      title="Sites in this analysis"
      intro="A site joins the pooled analysis once at least three quarters of its strips have a yield."
    >
      <DataTable
        caption={`${report.sitesIncluded.length} in, ${report.sitesExcluded.length} left out`}
        head={['Site', 'Soil', 'Previous crop', 'Strips with yield', 'Status']}
        rows={[
          ...report.sitesIncluded.map((s) => [
            s.fieldName,
            s.soil || '—',
            s.previousCrop || '—',
            `${s.stripsWithYield} of ${s.strips}`,
            <Badge tone="field">In</Badge>,
          ]),
          ...report.sitesExcluded.map((e) => [
            e.site.fieldName,
            e.site.soil || '—',
            e.site.previousCrop || '—',
            `${e.site.stripsWithYield} of ${e.site.strips}`,
            <span className="text-ink-muted">Left out: {e.reason}</span>,
          ]),
        ]}
      />
    </Section>
  );
}

/** The rate whose forest plot is shown first: half the full rate when tested, else the first. */
function defaultForestRate(comparisons: string[]): string | null {
  return comparisons.includes('0.5') ? '0.5' : (comparisons[0] ?? null);
}

function RatePicker({
  comparisons,
  shown,
  label,
  onPick,
}: {
  comparisons: string[];
  shown: string | null;
  label: (rate: string) => string;
  onPick: (rate: string) => void;
}) {
  if (comparisons.length < 2) return null;
  return (
    <div role="group" aria-label="Rate to compare" className="no-print flex flex-wrap gap-2">
      {comparisons.map((rate) => (
        <button
          key={rate}
          type="button"
          aria-pressed={rate === shown}
          onClick={() => onPick(rate)}
          className={cn(
            'min-h-11 rounded-full border px-4 text-label font-semibold',
            rate === shown
              ? 'border-accent bg-accent text-on-accent'
              : 'border-line-strong bg-surface text-ink hover:bg-sunken',
          )}
        >
          {label(rate)}
        </button>
      ))}
    </div>
  );
}

export function PooledForestSection({ report, analysis }: PooledAnalysisSectionProps) {
  const { label, referenceLabel } = usePooledLabels(report);
  const unit = report.trial.units.yield;
  const comparisons = analysis.differences.map((d) => d.rate);
  const [picked, setPicked] = useState<string | null>(null);
  const shownRate =
    picked && comparisons.includes(picked) ? picked : defaultForestRate(comparisons);
  const spec = useMemo(
    () =>
      shownRate
        ? forestSpec({
            rateLabel: label(shownRate),
            referenceLabel,
            yieldUnit: unit,
            sites: report.siteDifferences.filter((d) => d.rate === shownRate),
            pooled: analysis.differences.find((d) => d.rate === shownRate) ?? null,
          })
        : null,
    [shownRate, label, referenceLabel, unit, report.siteDifferences, analysis.differences],
  );
  return (
    <Section
      id="forest"
      title={`Each site against the ${rateName(referenceLabel)}`}
      intro="Squares are each site’s difference with its 95 % interval (that site on its own, not adjusted); the diamond is the network’s pooled difference. Bars that cross the dashed zero line could not tell the rates apart."
    >
      <RatePicker comparisons={comparisons} shown={shownRate} label={label} onPick={setPicked} />
      {spec ? (
        <ChartCard>
          <VegaChart
            spec={spec}
            title={`Forest plot ${label(shownRate ?? '')}`}
            description={`${label(shownRate ?? '')} minus ${referenceLabel}, ${unit}, by site.`}
          />
        </ChartCard>
      ) : null}
    </Section>
  );
}

export function PooledCurveSection({ report, analysis }: PooledAnalysisSectionProps) {
  const { label } = usePooledLabels(report);
  const { trial } = report;
  const unit = trial.units.yield;
  const curve = analysis.curve;
  const specs = useMemo(
    () => ({
      means: pooledMeansSpec({
        means: analysis.means.map((m) => ({
          label: label(m.rate),
          mean: m.mean,
          ciLow: m.ciLow,
          ciHigh: m.ciHigh,
        })),
        yieldUnit: unit,
      }),
      curve: responseCurveSpec({
        points: report.siteMeans.map((p) => ({
          site: p.site,
          seedRate: p.seedRate ?? Number(p.rate),
          mean: p.mean,
        })),
        curve: analysis.curve ?? null,
        agronomicOptimum: analysis.curve?.agronomicOptimum ?? null,
        economicOptimum: analysis.curve?.economicOptimum ?? null,
        seedUnit: trial.units.seed,
        yieldUnit: unit,
      }),
    }),
    [analysis, label, unit, report.siteMeans, trial.units.seed],
  );
  return (
    <Section
      id="curve"
      title="Response to seeding rate"
      intro="Each point is one site’s mean at one rate. The line is a quadratic fitted to those means; dashed lines mark the rate of highest yield and the rate of best return over seed cost at the prices above."
    >
      <div className="grid gap-4 lg:grid-cols-2">
        <ChartCard>
          <VegaChart
            spec={specs.curve}
            title="Response curve"
            description={`Yield (${unit}) against seeding rate (${trial.units.seed}).`}
          />
        </ChartCard>
        <ChartCard>
          <VegaChart
            spec={specs.means}
            title="Network rate means"
            description="Rate means over sites with 95 % confidence intervals (tested against site × rate)."
          />
        </ChartCard>
      </div>
      {curve ? (
        <p className="text-label text-ink">
          Highest yield at{' '}
          <strong>
            {curve.agronomicOptimum !== null
              ? `${formatNumber(curve.agronomicOptimum, 0)} ${trial.units.seed}`
              : curve.agronomicOptimumFlag}
          </strong>
          {curve.economics ? (
            <>
              ; best return over seed cost at{' '}
              <strong>
                {curve.economicOptimum != null
                  ? `${formatNumber(curve.economicOptimum, 0)} ${trial.units.seed}`
                  : curve.economicOptimumFlag}
              </strong>{' '}
              ({pricesInWords(report.prices, reportDisplayUnits(trial.units, trial.crop))})
            </>
          ) : null}
          .
        </p>
      ) : null}
    </Section>
  );
}

/** The classical combined analysis and the notes, under "For the statistician". */
export function PooledStatisticianSection({
  report,
  analysis,
}: PooledSectionProps & { analysis: Analysis | null }) {
  const { label, referenceLabel } = usePooledLabels(report);
  if (!analysis) return <StatisticianPart notes={report.forStatistician} />;
  const unit = report.trial.units.yield;
  const digits = decimalsFor(analysis.grandMean);
  const errorRow = analysis.anova.find((r) => r.source === 'site:rate');
  return (
    <StatisticianPart notes={report.forStatistician}>
      <StatisticianBlock
        title="Combined analysis of variance"
        intro={`Sites are taken as a random sample of farms, so rate is tested against the site × rate interaction (${analysis.rateTest.df1} and ${analysis.rateTest.df2} df${errorRow && 'ms' in errorRow ? `, mean square ${formatNumber(errorRow.ms, squaredDecimals(digits))}` : ''}), not against the strip error. ${analysis.method === 'site-means' ? 'Sites differ in blocks or have missing strips, so the analysis uses each site’s rate means.' : ''}`}
      >
        <AnovaTable
          anova={analysis.anova}
          digits={digits}
          caption="Combined analysis of variance"
        />
        <div className="grid gap-4 lg:grid-cols-2">
          <MeansTable
            means={analysis.means}
            label={label}
            unit={unit}
            digits={digits}
            caption="Rate means over sites, 95 % intervals for comparing rates (tested against site × rate)"
          />
          <DifferencesTable
            differences={analysis.differences}
            label={label}
            referenceLabel={referenceLabel}
            unit={unit}
            digits={digits}
          />
          {analysis.bartlett ? (
            <DataTableNote title="Homogeneity of site variances">
              Bartlett’s test: χ² = {formatNumber(analysis.bartlett.chiSquare, 2)} on{' '}
              {analysis.bartlett.df} df, {formatP(analysis.bartlett.p)}.{' '}
              {analysis.bartlett.p < 0.05
                ? 'Some sites were much noisier than others.'
                : 'The sites were about equally precise.'}
            </DataTableNote>
          ) : null}
        </div>
      </StatisticianBlock>
      {analysis.mixed ? (
        <StatisticianBlock
          title="Mixed model"
          intro="Intervals and p use Kenward–Roger standard errors and df; the Dunnett adjustment uses the multivariate t with each comparison’s own df."
        >
          <DifferencesDetailTable
            differences={analysis.mixed.differences.map((d) => ({ ...d, diff: d.estimate }))}
            caption={`Mixed model: difference from the ${referenceLabel} rate, one comparison and all comparisons`}
            label={label}
            referenceLabel={referenceLabel}
            unit={unit}
            digits={digits}
          />
        </StatisticianBlock>
      ) : null}
    </StatisticianPart>
  );
}

export function PooledEconomicsSection({ report, analysis }: PooledAnalysisSectionProps) {
  const { referenceLabel } = usePooledLabels(report);
  const { trial } = report;
  const digits = decimalsFor(analysis.grandMean);
  if (report.economics.length === 0) return null;
  return (
    <Section
      id="economics"
      title={`Economics per ${reportDisplayUnits(trial.units, trial.crop).landArea}`}
    >
      <EconomicsTable
        rows={report.economics}
        seedUnit={trial.units.seed}
        yieldUnit={trial.units.yield}
        moneyUnit={trial.units.money}
        referenceLabel={referenceLabel}
        digits={digits}
      />
    </Section>
  );
}

/** The three response curves and the network mixed model, under the response curve. */
export function PooledModelSections({ report, analysis }: PooledAnalysisSectionProps) {
  const { label, referenceLabel } = usePooledLabels(report);
  return (
    <>
      <ResponseModelsSection
        curves={analysis.curves}
        seedUnit={report.trial.units.seed}
        metric={reportDisplayUnits(report.trial.units).system === 'metric'}
        yieldUnit={report.trial.units.yield}
      />
      <MixedModelSection
        mixed={analysis.mixed}
        label={label}
        referenceLabel={referenceLabel}
        unit={report.trial.units.yield}
        digits={decimalsFor(analysis.grandMean)}
      />
    </>
  );
}
