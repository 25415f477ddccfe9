// Converts a seeding rate given in any of Sheaf's five units into all of them.
import type { RateUnit } from '../schemas/trial';
import {
  poundsPerAcreFromSeedsPerSquareFoot,
  seedsPerFootOfRowFromArea,
  seedsPerSquareFootFromPoundsPerAcre,
  seedsPerSquareFootFromRow,
  seedsPerSquareFootFromSquareMetre,
  seedsPerSquareMetreFromSquareFoot,
  type SeedSize,
} from './seeding-rate';
import { KG_PER_HA_PER_LB_PER_ACRE } from './constants';

export interface RateInAllUnits {
  poundsPerAcre: number;
  kilogramsPerHectare: number;
  seedsPerSquareFoot: number;
  seedsPerSquareMetre: number;
  seedsPerFootOfRow: number;
}

/**
 * Expresses one seeding rate in every unit, through seeds per ft² (seed count is the
 * common ground: weight units need the seed size, row units need the row spacing).
 *
 * @param value the rate in `unit`
 * @param unit one of lb/acre, kg/ha, seeds/ft2, seeds/m2, seeds/ft-row
 * @param context seed size (TKW or seeds per lb) and row spacing in inches
 * @throws Error when the value, seed size or spacing is not positive
 * @example convertRate(15, 'seeds/ft2', { size: { thousandKernelWeightGrams: 40 }, rowSpacingInches: 8 }).seedsPerFootOfRow // 10
 */
export function convertRate(
  value: number,
  unit: RateUnit,
  context: { size: SeedSize; rowSpacingInches: number },
): RateInAllUnits {
  if (!(value > 0) || !Number.isFinite(value))
    throw new Error(`convertRate needs a rate > 0 (got ${value})`);
  let seedsPerSquareFoot: number;
  switch (unit) {
    case 'lb/acre':
      seedsPerSquareFoot = seedsPerSquareFootFromPoundsPerAcre(value, context.size);
      break;
    case 'kg/ha':
      seedsPerSquareFoot = seedsPerSquareFootFromPoundsPerAcre(
        value / KG_PER_HA_PER_LB_PER_ACRE,
        context.size,
      );
      break;
    case 'seeds/ft2':
      seedsPerSquareFoot = value;
      break;
    case 'seeds/m2':
      seedsPerSquareFoot = seedsPerSquareFootFromSquareMetre(value);
      break;
    case 'seeds/ft-row':
      seedsPerSquareFoot = seedsPerSquareFootFromRow(value, context.rowSpacingInches);
      break;
    default:
      throw new Error(`convertRate: unknown unit "${String(unit)}"`);
  }
  const poundsPerAcre = poundsPerAcreFromSeedsPerSquareFoot(seedsPerSquareFoot, context.size);
  return {
    poundsPerAcre,
    kilogramsPerHectare: poundsPerAcre * KG_PER_HA_PER_LB_PER_ACRE,
    seedsPerSquareFoot,
    seedsPerSquareMetre: seedsPerSquareMetreFromSquareFoot(seedsPerSquareFoot),
    seedsPerFootOfRow: seedsPerFootOfRowFromArea(seedsPerSquareFoot, context.rowSpacingInches),
  };
}
