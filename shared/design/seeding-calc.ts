// The seed calculator: one rate (or target stand) and a seed lot → every unit, grams per row
// and strip, and seeds per seeder-wheel turn. Used by the public page and POST /api/calc/seeding.
import type { SeedingCalcParsed, SeedingCalcResult } from '../schemas/calc';
import {
  SQUARE_FEET_PER_ACRE,
  SQUARE_FEET_PER_SQUARE_METRE,
  GRAMS_PER_POUND,
} from '../units/constants';
import { convertRate } from '../units/rate-units';
import { seedsPerWheelTurn } from '../units/calibration';
import { seedForStrip, seedsToSow, type SeedSize } from '../units/seeding-rate';

/**
 * Converts a seeding rate, or a target stand in plants, into all of Sheaf's units. A target
 * stand is turned into seeds with the seed-count form plants ÷ (germination × emergence)
 * [NDSU-B; SDSU; ISU-O]; a rate is taken as seeds sown.
 *
 * @param input parsed SeedingCalcInputSchema (TKW or seeds/lb; TKW wins when both are given)
 * @returns every rate unit, expected plants, seed per row and strip, seeds per wheel turn
 * @throws Error from the unit conversions for non-positive values
 * @example calculateSeeding({ value: 10, unit: 'seeds/ft-row', rowSpacingIn: 8, thousandKernelWeightG: 40, germinationPct: 100, emergencePct: 100 }).seedsPerSquareFoot // 15
 */
export function calculateSeeding(input: SeedingCalcParsed): SeedingCalcResult {
  const size: SeedSize =
    input.thousandKernelWeightG !== undefined
      ? { thousandKernelWeightGrams: input.thousandKernelWeightG }
      : { seedsPerPound: input.seedsPerLb as number };
  const thousandKernelWeightG =
    'thousandKernelWeightGrams' in size
      ? size.thousandKernelWeightGrams
      : (1000 * GRAMS_PER_POUND) / size.seedsPerPound;
  const survival = (input.germinationPct / 100) * (input.emergencePct / 100);
  const context = { size, rowSpacingInches: input.rowSpacingIn };

  let rates;
  switch (input.unit) {
    case 'plants/ft2':
      rates = convertRate(
        seedsToSow(input.value, input.germinationPct, input.emergencePct),
        'seeds/ft2',
        context,
      );
      break;
    case 'plants/m2':
      rates = convertRate(
        seedsToSow(input.value, input.germinationPct, input.emergencePct),
        'seeds/m2',
        context,
      );
      break;
    case 'plants/acre':
      rates = convertRate(
        seedsToSow(input.value, input.germinationPct, input.emergencePct) / SQUARE_FEET_PER_ACRE,
        'seeds/ft2',
        context,
      );
      break;
    default:
      rates = convertRate(input.value, input.unit, context);
  }

  const strip =
    input.stripLengthFt !== undefined
      ? seedForStrip({
          seedsPerFootOfRow: rates.seedsPerFootOfRow,
          rows: input.rowsPerStrip ?? 1,
          lengthFeet: input.stripLengthFt,
          size,
        })
      : null;

  return {
    ...rates,
    seedsPerAcre: rates.seedsPerSquareFoot * SQUARE_FEET_PER_ACRE,
    thousandKernelWeightG,
    seedsPerLb: (1000 * GRAMS_PER_POUND) / thousandKernelWeightG,
    expectedPlantsPerSquareFoot: rates.seedsPerSquareFoot * survival,
    expectedPlantsPerSquareMetre:
      rates.seedsPerSquareFoot * SQUARE_FEET_PER_SQUARE_METRE * survival,
    perRow: strip ? { seeds: strip.seedsPerRow, grams: strip.gramsPerRow } : null,
    perStrip:
      strip && input.rowsPerStrip !== undefined
        ? { seeds: strip.seedsPerStrip, grams: strip.gramsPerStrip }
        : null,
    seedsPerWheelTurn:
      input.wheelCircumferenceFt !== undefined
        ? seedsPerWheelTurn(rates.seedsPerFootOfRow, input.wheelCircumferenceFt)
        : null,
  };
}
