// The pooled network report: sites in and out, findings, forest plot, response curve, the
// combined ANOVA with its error term, economics with adjustable prices, and filters.
import { useMemo, useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import {
  forestSpec,
  pooledMeansSpec,
  responseCurveSpec,
} from '../../../../shared/reports/chart-specs';
import { rateName } from '../../../../shared/reports/findings';
import {
  decimalsFor,
  formatMoney,
  formatNumber,
  formatP,
} from '../../../../shared/reports/format-numbers';
import type { PooledQuery, PooledReport } from '../../../../shared/schemas/report';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Button, buttonClasses } from '../../../components/ui/button';
import { PageHeader, type BackTo } from '../../../components/ui/page-header';
import { TextField } from '../../../components/ui/text-field';
import { cn } from '../../../lib/cn';
import { pooledSearch } from '../api/get-pooled-report';
import { usePublicLink, usePublishTrial } from '../api/publish-report';
import { FindingsList } from './findings-list';
import { MixedModelSection } from './mixed-model-section';
import { ResponseModelsSection } from './response-models-section';
import { StatisticianNotes } from './statistician-notes';
import { PublishPanel } from './publish-panel';
import { ChartCard, DataTableNote, DownloadLink, Section } from './report-bits';
import {
  AnovaTable,
  DataTable,
  DifferencesTable,
  EconomicsTable,
  MeansTable,
} from './report-tables';
import { VegaChart } from './vega-chart';

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

function PublicLinkControl({ trialId, token }: { trialId: string; token: string | null }) {
  const link = usePublicLink(trialId);
  const url = token ? `${window.location.origin}/shared/${token}` : null;
  return (
    <div className="flex flex-col gap-2 rounded-card border border-line bg-surface p-4 sm:flex-row sm:items-center">
      <div className="min-w-0 flex-1">
        <p className="font-semibold text-ink">Public read-only link</p>
        {url ? (
          <p className="break-all text-label text-accent">
            <a href={url}>{url}</a>
          </p>
        ) : (
          <p className="text-label text-ink-muted">
            Off. Anyone with the link can read the published report without signing in; grower names
            are not shown.
          </p>
        )}
      </div>
      <Button
        variant={url ? 'secondary' : 'primary'}
        busy={link.isPending}
        onClick={() => link.mutate(!url)}
      >
        {url ? 'Turn the link off' : 'Turn the link on'}
      </Button>
    </div>
  );
}

function FiltersForm({
  report,
  query,
  onQuery,
  isPublic,
}: Pick<PooledReportViewProps, 'report' | 'query' | 'onQuery' | 'isPublic'>) {
  const [seedPrice, setSeedPrice] = useState(String(report.prices.seedPricePerLb ?? ''));
  const [grainPrice, setGrainPrice] = useState(String(report.prices.grainPricePerBu ?? ''));
  const submitPrices = (event: FormEvent) => {
    event.preventDefault();
    const seed = Number(seedPrice);
    const grain = Number(grainPrice);
    onQuery({
      ...query,
      seedPrice: seedPrice === '' || !(seed >= 0) ? undefined : seed,
      grainPrice: grainPrice === '' || !(grain > 0) ? undefined : grain,
    });
  };
  const select = (name: 'soil' | 'previousCrop', label: string, options: string[]) => (
    <label className="flex flex-col gap-1.5 text-label text-ink">
      {label}
      <select
        value={query[name] ?? ''}
        onChange={(e) => onQuery({ ...query, [name]: e.target.value || undefined })}
        className="min-h-11 rounded-field border border-line-strong bg-surface px-3 text-body text-ink"
      >
        <option value="">All</option>
        {options.map((o) => (
          <option key={o} value={o}>
            {o}
          </option>
        ))}
      </select>
    </label>
  );
  return (
    <div className="no-print grid gap-4 rounded-card border border-line bg-sunken/60 p-4 lg:grid-cols-2">
      <fieldset className="grid gap-3 sm:grid-cols-2">
        <legend className="mb-2 text-label font-semibold text-ink">Which sites</legend>
        {select('soil', 'Soil', report.filterOptions.soil)}
        {select('previousCrop', 'Previous crop', report.filterOptions.previousCrop)}
        {!isPublic && report.canPublish ? (
          <label className="flex min-h-11 items-center gap-2 text-label text-ink sm:col-span-2">
            <input
              type="checkbox"
              className="size-5 accent-[var(--sheaf-accent)]"
              checked={query.sites === 'published'}
              onChange={(e) =>
                onQuery({ ...query, sites: e.target.checked ? 'published' : undefined })
              }
            />
            Only sites whose own report is published
          </label>
        ) : null}
      </fieldset>
      <form onSubmit={submitPrices} className="grid gap-3 sm:grid-cols-[1fr_1fr_auto] sm:items-end">
        <div className="sm:col-span-3">
          <p className="text-label font-semibold text-ink">Try other prices</p>
          <p className="text-caption text-ink-muted">
            Return over seed cost is worked out again at the prices you enter.
          </p>
        </div>
        <TextField
          label="Seed price"
          suffix="$/lb"
          inputMode="decimal"
          value={seedPrice}
          onChange={(e) => setSeedPrice(e.target.value)}
        />
        <TextField
          label="Grain price"
          suffix="$/bu"
          inputMode="decimal"
          value={grainPrice}
          onChange={(e) => setGrainPrice(e.target.value)}
        />
        <Button type="submit" variant="secondary">
          Recalculate
        </Button>
      </form>
    </div>
  );
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
  const unit = trial.units.yield;
  const digits = decimalsFor(analysis?.grandMean ?? 50);
  const labels = useMemo(() => new Map(trial.rates.map((r) => [r.key, r.label])), [trial.rates]);
  const label = (rate: string) => labels.get(rate) ?? rate;
  const referenceLabel = label(trial.reference);
  const comparisons = analysis?.differences.map((d) => d.rate) ?? [];
  const [forestRate, setForestRate] = useState<string | null>(null);
  const shownRate =
    forestRate && comparisons.includes(forestRate)
      ? forestRate
      : comparisons.includes('0.5')
        ? '0.5'
        : (comparisons[0] ?? null);

  const specs = useMemo(() => {
    if (!analysis) return null;
    const pooledDifference = analysis.differences.find((d) => d.rate === shownRate) ?? null;
    return {
      means: pooledMeansSpec({
        means: analysis.means.map((m) => ({
          label: label(m.rate),
          mean: m.mean,
          ciLow: m.ciLow,
          ciHigh: m.ciHigh,
        })),
        yieldUnit: unit,
      }),
      forest: shownRate
        ? forestSpec({
            rateLabel: label(shownRate),
            referenceLabel,
            yieldUnit: unit,
            sites: report.siteDifferences.filter((d) => d.rate === shownRate),
            pooled: pooledDifference,
          })
        : null,
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
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [report, shownRate]);

  const errorRow = analysis?.anova.find((r) => r.source === 'site:rate');
  const curve = analysis?.curve;
  return (
    <div className={cn('space-y-8', updating && 'opacity-70 transition-opacity')}>
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
                className={buttonClasses('primary', 'md', 'no-underline')}
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
      <StatisticianNotes notes={report.forStatistician} />

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

      {analysis && specs ? (
        <>
          <Section
            id="forest"
            title={`Each site against the ${rateName(referenceLabel)}`}
            intro="Squares are each site’s difference with its 95 % confidence interval; the diamond is the network’s pooled difference. Bars that cross the dashed zero line could not tell the rates apart."
          >
            {comparisons.length > 1 ? (
              <div
                role="group"
                aria-label="Rate to compare"
                className="no-print flex flex-wrap gap-2"
              >
                {comparisons.map((rate) => (
                  <button
                    key={rate}
                    type="button"
                    aria-pressed={rate === shownRate}
                    onClick={() => setForestRate(rate)}
                    className={cn(
                      'min-h-11 rounded-full border px-4 text-label font-semibold',
                      rate === shownRate
                        ? 'border-accent bg-accent text-on-accent'
                        : 'border-line-strong bg-surface text-ink hover:bg-sunken',
                    )}
                  >
                    {label(rate)}
                  </button>
                ))}
              </div>
            ) : null}
            {specs.forest ? (
              <ChartCard>
                <VegaChart
                  spec={specs.forest}
                  title={`Forest plot ${label(shownRate ?? '')}`}
                  description={`${label(shownRate ?? '')} minus ${referenceLabel}, ${unit}, by site.`}
                />
              </ChartCard>
            ) : null}
          </Section>
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
                    (seed {formatMoney(report.prices.seedPricePerLb)}/lb, grain{' '}
                    {formatMoney(report.prices.grainPricePerBu)}/bu)
                  </>
                ) : null}
                . R² {formatNumber(curve.rSquared, 2)} over {curve.points} site means.
              </p>
            ) : null}
          </Section>
          <ResponseModelsSection curves={analysis.curves} seedUnit={trial.units.seed} />
          <MixedModelSection
            mixed={analysis.mixed}
            label={label}
            referenceLabel={referenceLabel}
            unit={unit}
            digits={digits}
          />
          <Section
            id="combined"
            title="Combined analysis"
            intro={`Sites are taken as a random sample of farms, so rate is tested against the site × rate interaction (${analysis.rateTest.df1} and ${analysis.rateTest.df2} df${errorRow && 'ms' in errorRow ? `, mean square ${formatNumber(errorRow.ms, digits)}` : ''}), not against the strip error. ${analysis.method === 'site-means' ? 'Sites differ in blocks or have missing strips, so the analysis uses each site’s rate means.' : ''}`}
          >
            <AnovaTable
              anova={analysis.anova}
              digits={digits}
              caption="Combined analysis of variance"
            />
            <div className="grid gap-4 lg:grid-cols-2">
              <MeansTable means={analysis.means} label={label} unit={unit} digits={digits} />
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
          </Section>
          {report.economics.length > 0 ? (
            <Section id="economics" title="Economics per acre">
              <EconomicsTable
                rows={report.economics}
                seedUnit={trial.units.seed}
                yieldUnit={unit}
                moneyUnit={trial.units.money}
                referenceLabel={referenceLabel}
                digits={digits}
              />
            </Section>
          ) : null}
        </>
      ) : (
        <Alert tone="info" title="Not ready for a pooled analysis">
          {report.analysisError}
        </Alert>
      )}
    </div>
  );
}
