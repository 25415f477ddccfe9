// A trial's design in a few plain lines, in the trial's unit system: on the trial page and on
// the wizard's summary step.
import type { UpdateTrialInput } from '../../../../shared/schemas/trial';
import { cropLabel, pricePer, rateUnitLabel } from '../../../../shared/labels/labels';
import { CROPS } from '../../../../shared/units/crops';
import { designUnits, grainPriceUnit } from '../../../../shared/units/design-units';
import { cn } from '../../../lib/cn';

const amount = new Intl.NumberFormat('en', { maximumFractionDigits: 2 });
const multiplier = new Intl.NumberFormat('en', { maximumFractionDigits: 3 });

/** The design fields a summary reads (a trial from the API or the wizard's payload). */
export type DesignForSummary = UpdateTrialInput;

function bushelPoundsOf(design: DesignForSummary): number | null {
  if (design.crop === 'custom') return design.customCrop?.bushelWeightLb ?? null;
  return design.crop ? CROPS[design.crop].bushelPounds : null;
}

/** Label and value rows; values are already in the trial's units. */
export function designRows(design: DesignForSummary): [string, string][] {
  const units = designUnits(design.unitSystem ?? 'imperial');
  const grain = grainPriceUnit(design.unitSystem ?? 'imperial', bushelPoundsOf(design));
  const inUnit = (value: number | undefined | null, unit: typeof units.rowSpacing) =>
    value === undefined || value === null
      ? '?'
      : `${amount.format(unit.fromStored(value))} ${unit.unit}`;
  const crop =
    design.crop === 'custom' ? (design.customCrop?.name ?? 'Other crop') : cropLabel(design.crop);
  const border = design.borderRows ?? 0;
  return [
    ['Crop', design.crop ? crop : '—'],
    ['Season', design.season ?? '—'],
    [
      'Reference rate',
      design.referenceRate
        ? `${amount.format(design.referenceRate)} ${rateUnitLabel(design.referenceUnit)}`
        : '—',
    ],
    [
      'Rate levels',
      (design.rateLevels ?? [])
        .map((l) => `${l.label} (${multiplier.format(l.multiplier)} × full)`)
        .join(', ') || '—',
    ],
    ['Blocks per site', design.blocksPerSite !== undefined ? String(design.blocksPerSite) : '—'],
    [
      'Strips',
      design.rowsPerStrip && design.stripLengthFt
        ? `${design.rowsPerStrip} rows at ${inUnit(design.rowSpacingIn, units.rowSpacing)} × ${inUnit(design.stripLengthFt, units.stripLength)}, ${border} border row${border === 1 ? '' : 's'} each side`
        : '—',
    ],
    [
      'Seed lot',
      design.thousandKernelWeightG
        ? `${amount.format(design.thousandKernelWeightG)} g per 1,000 seeds, ${design.germinationPct ?? '?'} % germination, ${design.emergencePct ?? '?'} % expected emergence`
        : '—',
    ],
    [
      'Prices',
      `seed ${pricePer(units.seedPrice.fromStored(design.seedPricePerLb ?? 0), units.seedPrice.unit.slice(2))}, grain ${pricePer(grain.fromStored(design.grainPricePerBu ?? 0), grain.unit.slice(2))}`,
    ],
  ];
}

export function TrialDesignSummary({
  design,
  stacked = false,
  className,
}: {
  design: DesignForSummary;
  /** Label above value (a narrow side panel) rather than beside it. */
  stacked?: boolean;
  className?: string;
}) {
  return (
    <dl
      className={cn(
        'grid gap-x-6',
        stacked ? 'gap-y-2' : 'gap-y-3 sm:grid-cols-[12rem_minmax(0,1fr)]',
        className,
      )}
    >
      {designRows(design).map(([label, value]) => (
        <div key={label} className="contents">
          <dt className="text-label text-ink-muted">{label}</dt>
          <dd className="text-body text-ink">{value}</dd>
        </div>
      ))}
    </dl>
  );
}
