// Per-rate seed amounts for a trial design: what the wizard's summary and the field packet show.
import { convertRate } from '../units/rate-units';
import { seedForStrip } from '../units/seeding-rate';
import type { RateUnit } from '../schemas/trial';

export interface RateTableDesign {
  referenceRate?: number | null;
  referenceUnit?: RateUnit | string | null;
  rowSpacingIn?: number | null;
  rowsPerStrip?: number | null;
  stripLengthFt?: number | null;
  thousandKernelWeightG?: number | null;
  germinationPct?: number | null;
  emergencePct?: number | null;
  rateLevels: readonly { id?: string; multiplier: number; label: string }[];
}

export interface RateTableRow {
  rateLevelId: string | null;
  label: string;
  multiplier: number;
  seedsPerFootOfRow: number;
  seedsPerSquareFoot: number;
  seedsPerSquareMetre: number;
  poundsPerAcre: number;
  kilogramsPerHectare: number;
  gramsPerRow: number;
  gramsPerStrip: number;
  seedsPerStrip: number;
  /** Seeds × germination × expected emergence. */
  expectedPlantsPerSquareFoot: number;
}

/** True when the design has what the seed amounts need. */
export function hasSeedInputs(design: RateTableDesign): boolean {
  return Boolean(
    design.referenceRate &&
    design.referenceUnit &&
    design.rowSpacingIn &&
    design.rowsPerStrip &&
    design.stripLengthFt &&
    design.thousandKernelWeightG,
  );
}

/**
 * Seed amounts for every rate level of a design (reference rate × multiplier, through
 * convertRate and seedForStrip). Returns [] while the design lacks a needed value.
 *
 * @example rateTable({ referenceRate: 15, referenceUnit: 'seeds/ft2', rowSpacingIn: 8, rowsPerStrip: 6, stripLengthFt: 100, thousandKernelWeightG: 40, rateLevels: [{ multiplier: 1, label: 'full' }] })[0].gramsPerStrip // 240
 */
export function rateTable(design: RateTableDesign): RateTableRow[] {
  if (!hasSeedInputs(design)) return [];
  const size = { thousandKernelWeightGrams: design.thousandKernelWeightG as number };
  const survival = ((design.germinationPct ?? 100) / 100) * ((design.emergencePct ?? 100) / 100);
  return [...design.rateLevels]
    .sort((a, b) => a.multiplier - b.multiplier)
    .map((level) => {
      const rate = convertRate(
        (design.referenceRate as number) * level.multiplier,
        design.referenceUnit as RateUnit,
        {
          size,
          rowSpacingInches: design.rowSpacingIn as number,
        },
      );
      const strip = seedForStrip({
        seedsPerFootOfRow: rate.seedsPerFootOfRow,
        rows: design.rowsPerStrip as number,
        lengthFeet: design.stripLengthFt as number,
        size,
      });
      return {
        rateLevelId: level.id ?? null,
        label: level.label,
        multiplier: level.multiplier,
        seedsPerFootOfRow: rate.seedsPerFootOfRow,
        seedsPerSquareFoot: rate.seedsPerSquareFoot,
        seedsPerSquareMetre: rate.seedsPerSquareMetre,
        poundsPerAcre: rate.poundsPerAcre,
        kilogramsPerHectare: rate.kilogramsPerHectare,
        gramsPerRow: strip.gramsPerRow,
        gramsPerStrip: strip.gramsPerStrip,
        seedsPerStrip: strip.seedsPerStrip,
        expectedPlantsPerSquareFoot: rate.seedsPerSquareFoot * survival,
      };
    });
}
