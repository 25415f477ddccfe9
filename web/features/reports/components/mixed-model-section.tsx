// The network mixed model in a pooled report: expected yield at a farm like these, and differences from the reference rate.
import type { MixedModelAnalysis } from '../../../../shared/analysis/types';
import { formatNumber, formatP } from '../../../../shared/reports/format-numbers';
import { DataTableNote, Section } from './report-bits';
import { DataTable } from './report-tables';

const interval = (low: number, high: number, digits: number) =>
  `${formatNumber(low, digits)} to ${formatNumber(high, digits)}`;
const signed = (value: number, digits: number) =>
  `${value > 0 ? '+' : ''}${formatNumber(value, digits)}`;

export function MixedModelSection({
  mixed,
  label,
  referenceLabel,
  unit,
  digits,
}: {
  mixed: MixedModelAnalysis | undefined;
  label: (rate: string) => string;
  referenceLabel: string;
  unit: string;
  digits: number;
}) {
  if (!mixed) return null;
  const level = Math.round((1 - mixed.alpha) * 100);
  const components = mixed.varianceComponents;
  return (
    <Section
      id="farm-like-these"
      title="Expected yield at a farm like these"
      intro={mixed.captions.means}
    >
      <DataTable
        caption={`Expected yield at a farm like these, with ${level} % intervals`}
        head={['Rate', `Mean (${unit})`, `${level} % interval`]}
        rows={mixed.means.map((m) => [
          label(m.rate),
          formatNumber(m.mean, digits),
          interval(m.ciLow, m.ciHigh, digits),
        ])}
      />
      <DataTable
        caption={`Difference from the ${referenceLabel} rate`}
        head={[
          'Rate',
          `Difference (${unit})`,
          `${level} % interval, one comparison`,
          'p, one comparison',
          `${level} % interval, all comparisons (Dunnett)`,
          'p, all comparisons (Dunnett)',
        ]}
        rows={mixed.differences.map((d) => [
          label(d.rate),
          signed(d.estimate, digits),
          interval(d.ciLow, d.ciHigh, digits),
          formatP(d.p),
          interval(d.ciLowAdjusted, d.ciHighAdjusted, digits),
          formatP(d.pAdjusted),
        ])}
      />
      <p className="max-w-prose text-label text-ink-muted">
        Difference from the {referenceLabel} rate: intervals and p for “one comparison” treat each
        rate on its own; those for “all comparisons (Dunnett)” hold for every comparison with the{' '}
        {referenceLabel} rate together, so they are wider.
      </p>
      <DataTableNote title="For the statistician">
        Mixed model fitted by REML to {mixed.observations} strips at {mixed.sites} sites: rate
        fixed; site, block within site and site × rate random. Variance components: site{' '}
        {formatNumber(components.site, 3)}, block within site{' '}
        {formatNumber(components.blockWithinSite, 3)}, site × rate{' '}
        {formatNumber(components.siteByRate, 3)}, strips {formatNumber(components.residual, 3)}.
        Rate test: F = {formatNumber(mixed.rateTest.f, 2)} on {mixed.rateTest.df1} and{' '}
        {formatNumber(mixed.rateTest.df2, 1)} df (Kenward–Roger), {formatP(mixed.rateTest.p)}.
        Intervals use Kenward–Roger standard errors and df; Dunnett adjustment by the multivariate t
        with each comparison’s own df.
      </DataTableNote>
    </Section>
  );
}
