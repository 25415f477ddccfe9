// The seed calculator's answers: the rate in every unit (the one typed is marked), grams per row
// and strip, seeds per wheel turn and the stand to expect.
import type { CalcUnit, SeedingCalcResult } from '../../../../shared/schemas/calc';
import { seedGrams } from '../../../../shared/labels/labels';
import type { UnitSystem } from '../../../../shared/schemas/trial';
import { GRAMS_PER_POUND, METRES_PER_FOOT } from '../../../../shared/units/constants';
import { cn } from '../../../lib/cn';

const f1 = new Intl.NumberFormat('en', { maximumFractionDigits: 1 });
const f0 = new Intl.NumberFormat('en', { maximumFractionDigits: 0 });

function RateCards({
  result,
  unit,
  system,
}: {
  result: SeedingCalcResult;
  unit: CalcUnit;
  system: UnitSystem;
}) {
  const cards: [string, string, boolean][] =
    system === 'metric'
      ? [
          // Seeds per metre of row = seeds per foot ÷ 0.3048 (1 ft = 0.3048 m, exact).
          ['Seeds per metre of row', f1.format(result.seedsPerFootOfRow / METRES_PER_FOOT), false],
          ['Seeds per m²', f0.format(result.seedsPerSquareMetre), unit === 'seeds/m2'],
          ['kg per hectare', f1.format(result.kilogramsPerHectare), unit === 'kg/ha'],
          ['Seeds per hectare', f0.format(result.seedsPerSquareMetre * 10_000), false],
        ]
      : [
          ['Seeds per foot of row', f1.format(result.seedsPerFootOfRow), unit === 'seeds/ft-row'],
          ['Seeds per ft²', f1.format(result.seedsPerSquareFoot), unit === 'seeds/ft2'],
          ['Seeds per m²', f0.format(result.seedsPerSquareMetre), unit === 'seeds/m2'],
          ['lb per acre', f1.format(result.poundsPerAcre), unit === 'lb/acre'],
          ['kg per hectare', f1.format(result.kilogramsPerHectare), unit === 'kg/ha'],
          ['Seeds per acre', f0.format(result.seedsPerAcre), false],
        ];
  return (
    <dl className="grid grid-cols-2 gap-3" data-testid="calc-results">
      {cards.map(([label, value, given]) => (
        <div
          key={label}
          className={cn(
            'rounded-field border p-3',
            given ? 'border-accent bg-accent-soft' : 'border-line bg-surface',
          )}
        >
          <dt className="text-caption text-ink-muted">
            {label}
            {given ? <span className="sr-only"> (what you typed)</span> : null}
          </dt>
          <dd className="figures text-heading text-ink">{value}</dd>
        </div>
      ))}
    </dl>
  );
}

function Amounts({ result, system }: { result: SeedingCalcResult; system: UnitSystem }) {
  const metric = system === 'metric';
  const rows: [string, string][] = [
    [
      'Per row of the strip',
      result.perRow
        ? `${seedGrams(result.perRow.grams)} · ${f0.format(result.perRow.seeds)} seeds`
        : '—',
    ],
    [
      'Per strip',
      result.perStrip
        ? `${seedGrams(result.perStrip.grams)} · ${f0.format(result.perStrip.seeds)} seeds`
        : '—',
    ],
    [
      'Seeds per wheel turn',
      result.seedsPerWheelTurn === null ? '—' : f1.format(result.seedsPerWheelTurn),
    ],
    [
      'Expected plants',
      metric
        ? `${f0.format(result.expectedPlantsPerSquareMetre)} /m²`
        : `${f1.format(result.expectedPlantsPerSquareFoot)} /ft² · ${f0.format(result.expectedPlantsPerSquareMetre)} /m²`,
    ],
    [
      'Seed size',
      metric
        ? `${f1.format(result.thousandKernelWeightG)} g/1,000 · ${f0.format((result.seedsPerLb * 1000) / GRAMS_PER_POUND)} seeds/kg`
        : `${f1.format(result.thousandKernelWeightG)} g/1,000 · ${f0.format(result.seedsPerLb)} seeds/lb`,
    ],
  ];
  return (
    <dl className="grid gap-2 rounded-card border border-line bg-surface p-4 text-label sm:grid-cols-2">
      {rows.map(([label, value]) => (
        <div key={label}>
          <dt className="text-ink-muted">{label}</dt>
          <dd className="figures font-semibold">{value}</dd>
        </div>
      ))}
    </dl>
  );
}

export function SeedCalculatorResults({
  result,
  unit,
  system = 'imperial',
  problem,
}: {
  result: SeedingCalcResult | null;
  unit: CalcUnit;
  system?: UnitSystem;
  problem: string | null;
}) {
  return (
    <section aria-labelledby="calc-results" aria-live="polite" className="min-w-0 space-y-4">
      <h2 id="calc-results" className="text-heading text-ink">
        Results
      </h2>
      {result ? (
        <>
          <RateCards result={result} unit={unit} system={system} />
          <Amounts result={result} system={system} />
          <p className="text-caption text-ink-muted">
            {unit.startsWith('plants')
              ? 'From a target stand, seeds to sow = plants ÷ (germination × emergence). '
              : 'A rate is taken as seeds sown; expected plants = seeds × germination × emergence. '}
            Stand loss grows with the rate, so count the stand rather than trust the estimate.
          </p>
        </>
      ) : (
        <p className="rounded-field border border-dashed border-line-strong bg-sunken p-4 text-ink-muted">
          {problem ?? 'Fill in the highlighted fields to see the results.'}
        </p>
      )}
    </section>
  );
}
