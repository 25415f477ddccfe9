// The network mixed model in a pooled report: expected yield at a farm like these, and differences from the reference rate.
import type { MixedModelAnalysis } from '../../../../shared/analysis/types';
import { formatNumber } from '../../../../shared/reports/format-numbers';
import {
  comparisonVerdict,
  signedNumber,
  verdictWords,
} from '../../../../shared/reports/plain-words';
import { Section } from './report-bits';
import { DataTable } from '../../../components/ui/data-table';

const interval = (low: number, high: number, digits: number) =>
  `${signedNumber(low, digits)} to ${signedNumber(high, digits)}`;
const signed = signedNumber;

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
  return (
    <Section
      id="farm-like-these"
      title="Expected yield at a farm like these"
      intro={mixed.captions.means}
    >
      <DataTable
        caption={`Expected yield at a farm like these, with ${level} % intervals`}
        head={['Rate', `Mean (${unit})`, `${level} % interval, a farm like these`]}
        rows={mixed.means.map((m) => [
          label(m.rate),
          formatNumber(m.mean, digits),
          `${formatNumber(m.ciLow, digits)} – ${formatNumber(m.ciHigh, digits)}`,
        ])}
      />
      <DataTable
        caption={`Difference from the ${referenceLabel} rate`}
        head={[
          'Rate',
          `Difference (${unit})`,
          `${level} % interval, one comparison`,
          `${level} % interval, all comparisons (Dunnett)`,
          'What it means (Dunnett)',
        ]}
        rows={mixed.differences.map((d) => [
          label(d.rate),
          signed(d.estimate, digits),
          interval(d.ciLow, d.ciHigh, digits),
          interval(d.ciLowAdjusted, d.ciHighAdjusted, digits),
          verdictWords(
            comparisonVerdict({ low: d.ciLowAdjusted, high: d.ciHighAdjusted }),
            `${referenceLabel} rate`,
          ),
        ])}
      />
      <p className="max-w-prose text-label text-ink-muted">
        Difference from the {referenceLabel} rate: the “one comparison” interval treats each rate on
        its own; the “all comparisons (Dunnett)” interval holds for every comparison with the{' '}
        {referenceLabel} rate together, so it is wider. A rate clearly differs only when its whole
        Dunnett interval is on one side of zero. The p-values and the model’s details are under “For
        the statistician” below.
      </p>
    </Section>
  );
}
