// Response curves with site effects removed: the three fits, the AIC choice and optimum rates with intervals.
import type { OptimumInterval, ResponseModels } from '../../../../shared/analysis/index';
import { formatNumber } from '../../../../shared/reports/format-numbers';
import { KILOGRAMS_PER_TONNE } from '../../../../shared/units/constants';
import { Section } from './report-bits';
import { DataTable } from '../../../components/ui/data-table';

const MODEL_NAMES = {
  quadratic: 'Curved (quadratic)',
  'linear-plateau': 'Straight rise, then level',
  'quadratic-plateau': 'Curved rise, then level',
} as const;

function optimumText(optimum: OptimumInterval | null | undefined, unit: string): string {
  if (!optimum) return 'none in the tested rates';
  const text = `${formatNumber(optimum.value, 1)} ${unit} (${formatNumber(optimum.ciLow, 1)} to ${formatNumber(optimum.ciHigh, 1)})`;
  return optimum.beyondTestedRates ? `${text}, beyond the tested rates` : text;
}

export function ResponseModelsSection({
  curves,
  seedUnit,
  metric = false,
  yieldUnit,
}: {
  curves: ResponseModels | undefined;
  seedUnit: string;
  /** A metric trial prices seed per kg and grain per tonne (per kg in reports published before t/ha). */
  metric?: boolean;
  /** The report's yield unit: the analysis prices grain per unit of it. */
  yieldUnit?: string;
}) {
  if (!curves) return null;
  // Both prices per kg on a metric trial: the engine's ratio is per kg of seed ÷ per tonne of
  // grain on a t/ha report, 1000 kg to the tonne (NIST SP 811, Appendix B.8).
  const ratioFactor = metric && yieldUnit === 't/ha' ? KILOGRAMS_PER_TONNE : 1;
  const chosen = MODEL_NAMES[curves.chosen];
  return (
    <Section
      id="curves-within-sites"
      title="Does yield level off?"
      intro={`Three curves fitted through each site's rate means with each farm's own yield level taken out. The best-supported shape is “${chosen.toLowerCase()}” (smallest AIC). Rates in brackets are 95 % intervals (delta method).`}
    >
      <DataTable
        caption="Curve shapes compared"
        head={[
          'Shape',
          'Rate of highest yield (95 % interval)',
          'Best return over seed (95 % interval)',
          'Share of within-farm variation explained',
          'AIC',
        ]}
        rows={curves.models.map((m) => [
          `${MODEL_NAMES[m.model]}${m.model === curves.chosen ? ' (chosen)' : ''}`,
          optimumText(m.agronomicOptimum, seedUnit),
          m.economicOptimum === undefined ? '—' : optimumText(m.economicOptimum, seedUnit),
          `${formatNumber(100 * m.rSquaredWithinSites, 0)} %`,
          formatNumber(m.aic, 1),
        ])}
      />
      {curves.economicTable ? (
        <DataTable
          caption={`Best return over seed at other seed-to-grain price ratios (${chosen.toLowerCase()})`}
          head={[
            metric
              ? 'Seed price per kg ÷ grain price per kg'
              : 'Seed price per lb ÷ grain price per bushel',
            'Rate of best return (95 % interval)',
          ]}
          rows={curves.economicTable.map((row) => [
            formatNumber(row.priceRatio * ratioFactor, 3),
            optimumText(row.optimum, seedUnit),
          ])}
        />
      ) : null}
    </Section>
  );
}
