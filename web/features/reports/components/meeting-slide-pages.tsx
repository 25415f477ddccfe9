// The meeting view's slides, one component each, all reading the same slide context: the pooled
// report, its analysis, the chart theme and the rate wording.
import {
  forestSpec,
  pooledMeansSpec,
  responseCurveSpec,
  type ChartTheme,
} from '../../../../shared/reports/chart-specs';
import { networkComparisons, rateName } from '../../../../shared/reports/findings';
import { comparisonLine, farmsAgreeSentence } from '../../../../shared/reports/plain-words';
import { formatMoney, formatNumber } from '../../../../shared/reports/format-numbers';
import type { PooledReport } from '../../../../shared/schemas/report';
import { cn } from '../../../lib/cn';
import { VegaChart } from './vega-chart';

export interface SlideContext {
  report: PooledReport;
  theme: ChartTheme;
  label: (rate: string) => string;
  referenceLabel: string;
  unit: string;
  digits: number;
  /** The rate the network asked about most (half the full rate when tested). */
  keyRate: string | undefined;
}

type Analysis = NonNullable<PooledReport['analysis']>;
export type AnalysedSlideContext = SlideContext & { analysis: Analysis };

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

export function Lines({ items }: { items: string[] }) {
  return (
    <ul className="space-y-5">
      {items.map((item, i) => (
        <li key={i} className="flex gap-4">
          <span aria-hidden="true" className="mt-[0.6em] size-3 shrink-0 rounded-full bg-accent" />
          <span>{item}</span>
        </li>
      ))}
    </ul>
  );
}

export function TitleSlide({ report }: SlideContext) {
  const { trial } = report;
  return (
    <div className="space-y-6">
      <p className="text-[clamp(1.5rem,3vw,2.6rem)] text-ink-muted">
        {[trial.cropName, trial.season].filter(Boolean).join(' · ')} · {report.sitesIncluded.length}{' '}
        sites
      </p>
      <p className="text-[clamp(1.1rem,2vw,1.6rem)] text-ink-muted">
        Seeding-rate strip trial, randomized complete blocks at every farm.
      </p>
    </div>
  );
}

export function QuestionSlide({ report }: SlideContext) {
  const { trial } = report;
  return (
    <p className="max-w-[40ch] text-[clamp(1.8rem,4vw,3.4rem)] font-semibold leading-tight">
      {trial.question || 'How much seed do we really need?'}
    </p>
  );
}

export function SitesSlide({ report }: SlideContext) {
  return (
    <div className="grid gap-8 lg:grid-cols-2">
      <ul className="grid grid-cols-1 gap-3 sm:grid-cols-2">
        {report.sitesIncluded.map((s) => (
          <li key={s.id} className="rounded-card border border-line bg-surface px-4 py-3">
            <p className="font-semibold">{s.fieldName}</p>
            <p className="text-[0.75em] text-ink-muted">
              {[s.soil, s.previousCrop && `after ${s.previousCrop}`].filter(Boolean).join(', ')}
            </p>
          </li>
        ))}
      </ul>
      {report.sitesExcluded.length > 0 ? (
        <div>
          <p className="mb-3 font-semibold">Left out</p>
          <Lines items={report.sitesExcluded.map((e) => `${e.site.fieldName}: ${e.reason}`)} />
        </div>
      ) : (
        <p className="text-ink-muted">Every enrolled site had complete data.</p>
      )}
    </div>
  );
}

function answerLines(ctx: AnalysedSlideContext): string[] {
  const { analysis, label, referenceLabel, unit, digits, keyRate, report } = ctx;
  const name = (rate: string) => rateName(label(rate));
  const wording = { unit, digits, scope: 'network' as const };
  const lines = networkComparisons(analysis, name).map((c) => comparisonLine(c, wording));
  if (keyRate) {
    const perSite = report.siteDifferences.filter((d) => d.rate === keyRate);
    lines.push(
      farmsAgreeSentence({
        rate: name(keyRate),
        reference: rateName(referenceLabel),
        within: perSite.filter((d) => d.p >= analysis.alpha).length,
        lower: perSite.filter((d) => d.p < analysis.alpha && d.diff < 0).length,
        higher: perSite.filter((d) => d.p < analysis.alpha && d.diff > 0).length,
        total: perSite.length,
      }),
    );
  }
  return lines;
}

export function AnswerSlide(ctx: AnalysedSlideContext) {
  const { analysis, label, unit, theme } = ctx;
  // Expected yield at a farm like these (mixed model) when fitted, else the combined means.
  const means = analysis.mixed?.means ?? analysis.means;
  return (
    <div className="grid items-start gap-8 lg:grid-cols-[3fr_2fr]">
      <VegaChart
        spec={pooledMeansSpec(
          {
            means: means.map((m) => ({
              label: label(m.rate),
              mean: m.mean,
              ciLow: m.ciLow,
              ciHigh: m.ciHigh,
            })),
            yieldUnit: unit,
          },
          { theme, scale: 1.5 },
        )}
        title="Network rate means"
        description={
          analysis.mixed
            ? 'Expected yield at a farm like these, with 95 % intervals that allow for farm-to-farm differences.'
            : 'Mean yield over sites with 95 % intervals for comparing rates (tested against site × rate).'
        }
        downloads={false}
      />
      <div className="text-[clamp(1.1rem,1.9vw,1.6rem)]">
        <Lines items={answerLines(ctx)} />
      </div>
    </div>
  );
}

export function forestTitle({ label, keyRate, referenceLabel }: SlideContext): string {
  return `${capitalise(rateName(label(keyRate ?? '')))} against ${rateName(referenceLabel)}, farm by farm`;
}

export function ForestSlide({
  analysis,
  label,
  keyRate,
  referenceLabel,
  unit,
  theme,
  report,
}: AnalysedSlideContext) {
  if (!keyRate) return null;
  return (
    <VegaChart
      spec={forestSpec(
        {
          rateLabel: label(keyRate),
          referenceLabel,
          yieldUnit: unit,
          sites: report.siteDifferences.filter((d) => d.rate === keyRate),
          pooled: analysis.differences.find((d) => d.rate === keyRate) ?? null,
        },
        { theme, scale: 1.5 },
      )}
      title="Forest plot"
      description="Each farm’s difference with its 95 % interval (that farm on its own, not adjusted); the diamond is the network’s pooled difference."
      downloads={false}
    />
  );
}

function EconomicsTable({ report, referenceLabel, digits }: SlideContext) {
  const { trial } = report;
  return (
    <table className="figures w-full text-[clamp(1rem,1.7vw,1.5rem)]">
      <caption className="pb-3 text-left text-[0.8em] text-ink-muted">
        Seed {formatMoney(report.prices.seedPricePerLb)}/lb, grain{' '}
        {formatMoney(report.prices.grainPricePerBu)}/bu, per acre
      </caption>
      <thead>
        <tr className="text-left text-ink-muted">
          <th className="pb-2 font-semibold">Rate</th>
          <th className="pb-2 text-right font-semibold">Yield</th>
          <th className="pb-2 text-right font-semibold">Over seed</th>
          <th className="pb-2 text-right font-semibold">vs {referenceLabel}</th>
        </tr>
      </thead>
      <tbody>
        {report.economics.map((e) => (
          <tr
            key={e.rate}
            className={cn('border-t border-line', e.rate === trial.reference && 'text-ink-muted')}
          >
            <th scope="row" className="py-2 text-left font-semibold">
              {e.label}
            </th>
            <td className="py-2 text-right">{formatNumber(e.meanYield, digits)}</td>
            <td className="py-2 text-right">{formatMoney(e.returnOverSeedCost)}</td>
            <td className="py-2 text-right">
              {e.versusReference === null
                ? '–'
                : `${e.versusReference > 0.005 ? '+' : ''}${formatMoney(e.versusReference)}`}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

export function EconomicsSlide(ctx: AnalysedSlideContext) {
  const { analysis, report, unit, theme } = ctx;
  const curve = analysis.curve;
  return (
    <div className="grid items-start gap-8 lg:grid-cols-2">
      <VegaChart
        spec={responseCurveSpec(
          {
            points: report.siteMeans.map((p) => ({
              site: p.site,
              seedRate: p.seedRate ?? Number(p.rate),
              mean: p.mean,
            })),
            curve: curve ?? null,
            agronomicOptimum: curve?.agronomicOptimum ?? null,
            economicOptimum: curve?.economicOptimum ?? null,
            seedUnit: report.trial.units.seed,
            yieldUnit: unit,
          },
          { theme, scale: 1.4 },
        )}
        title="Response curve"
        description="Site means against seeding rate, the fitted curve, and the rates of highest yield and best return over seed."
        downloads={false}
      />
      <EconomicsTable {...ctx} />
    </div>
  );
}

export function NextSlide({ report }: SlideContext) {
  const couldNot = report.findings.find((f) => f.startsWith('What the network could not tell'));
  return (
    <Lines
      items={[
        ...(couldNot
          ? [couldNot.replace('What the network could not tell: ', 'We could not tell ')]
          : []),
        'Repeat the trial next season, ideally on the same farms, before anyone changes rates on every field.',
        'Growers: read your own site report and compare it with the network.',
        'Rates in a trial are treatments to compare, not recommendations; local extension advice and the seed label come first.',
      ]}
    />
  );
}

/** The last slide: the test statistics, in smaller type, for anyone who asks. */
export function StatisticianSlide({ report }: SlideContext) {
  const notes = report.forStatistician ?? [];
  return (
    <ul className="max-w-[80ch] list-disc space-y-3 pl-6 text-[clamp(0.85rem,1.25vw,1.1rem)] text-ink-muted">
      {notes.map((note) => (
        <li key={note}>{note}</li>
      ))}
    </ul>
  );
}
