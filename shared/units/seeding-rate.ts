// Seeding-rate conversions: seeds per row length ↔ seeds per area ↔ weight per area.
import {
  GRAMS_PER_POUND,
  INCHES_PER_FOOT,
  SQUARE_FEET_PER_ACRE,
  SQUARE_FEET_PER_SQUARE_METRE,
} from './constants';

/** Seed size: thousand-kernel weight in grams, or seeds per pound. */
export type SeedSize = { thousandKernelWeightGrams: number } | { seedsPerPound: number };

function gramsPerSeed(size: SeedSize, caller: string): number {
  if ('thousandKernelWeightGrams' in size) {
    if (!(size.thousandKernelWeightGrams > 0))
      throw new Error(`${caller} needs a thousand-kernel weight > 0`);
    return size.thousandKernelWeightGrams / 1000;
  }
  if (!(size.seedsPerPound > 0)) throw new Error(`${caller} needs seeds per pound > 0`);
  return GRAMS_PER_POUND / size.seedsPerPound;
}

function positive(value: number, what: string, caller: string): void {
  if (!(value > 0) || !Number.isFinite(value))
    throw new Error(`${caller} needs ${what} > 0 (got ${value})`);
}

/**
 * Seeds per ft² from seeds per foot of row: seeds/ft × 12 ÷ row spacing (in) [UKY-S; PSU-WS].
 * @example seedsPerSquareFootFromRow(10, 8) // 15
 */
export function seedsPerSquareFootFromRow(
  seedsPerFootOfRow: number,
  rowSpacingInches: number,
): number {
  positive(rowSpacingInches, 'a row spacing', 'seedsPerSquareFootFromRow');
  return (seedsPerFootOfRow * INCHES_PER_FOOT) / rowSpacingInches;
}

/**
 * Seeds per foot of row from seeds per ft²: seeds/ft² × row spacing (in) ÷ 12.
 * @example seedsPerFootOfRowFromArea(1e6 / 43560, 7) // 13.39 (UMN table: 13.4 at 1.0 M/ac)
 */
export function seedsPerFootOfRowFromArea(
  seedsPerSquareFoot: number,
  rowSpacingInches: number,
): number {
  positive(rowSpacingInches, 'a row spacing', 'seedsPerFootOfRowFromArea');
  return (seedsPerSquareFoot * rowSpacingInches) / INCHES_PER_FOOT;
}

/**
 * Seeds per m² from seeds per metre of row: seeds/m ÷ row spacing (m).
 * @example seedsPerSquareMetreFromRow(30, 0.2) // 150
 */
export function seedsPerSquareMetreFromRow(
  seedsPerMetreOfRow: number,
  rowSpacingMetres: number,
): number {
  positive(rowSpacingMetres, 'a row spacing', 'seedsPerSquareMetreFromRow');
  return seedsPerMetreOfRow / rowSpacingMetres;
}

/** Seeds per m² from seeds per ft² (× 10.7639). @example seedsPerSquareMetreFromSquareFoot(1) // 10.764 */
export function seedsPerSquareMetreFromSquareFoot(seedsPerSquareFoot: number): number {
  return seedsPerSquareFoot * SQUARE_FEET_PER_SQUARE_METRE;
}

/** Seeds per ft² from seeds per m² (÷ 10.7639). @example seedsPerSquareFootFromSquareMetre(10.764) // 1.0 */
export function seedsPerSquareFootFromSquareMetre(seedsPerSquareMetre: number): number {
  return seedsPerSquareMetre / SQUARE_FEET_PER_SQUARE_METRE;
}

/**
 * lb/ac from seeds per ft²: seeds/ft² × 43,560 × grams per seed ÷ 453.59237 [GN-AB: the
 * 10.4 divisor is 453.59 × 1000 ÷ 43,560].
 * @example poundsPerAcreFromSeedsPerSquareFoot(22.2, { thousandKernelWeightGrams: 33 }) // 70.3
 */
export function poundsPerAcreFromSeedsPerSquareFoot(
  seedsPerSquareFoot: number,
  size: SeedSize,
): number {
  return (
    (seedsPerSquareFoot *
      SQUARE_FEET_PER_ACRE *
      gramsPerSeed(size, 'poundsPerAcreFromSeedsPerSquareFoot')) /
    GRAMS_PER_POUND
  );
}

/** Seeds per ft² from lb/ac (inverse of poundsPerAcreFromSeedsPerSquareFoot). */
export function seedsPerSquareFootFromPoundsPerAcre(poundsPerAcre: number, size: SeedSize): number {
  return (
    (poundsPerAcre * GRAMS_PER_POUND) /
    (SQUARE_FEET_PER_ACRE * gramsPerSeed(size, 'seedsPerSquareFootFromPoundsPerAcre'))
  );
}

/**
 * kg/ha from seeds per m²: seeds/m² × TKW (g) ÷ 100 [ADAS; BASF, with establishment 100 %].
 * @example kilogramsPerHectareFromSeedsPerSquareMetre(400, { thousandKernelWeightGrams: 25 }) // 100
 */
export function kilogramsPerHectareFromSeedsPerSquareMetre(
  seedsPerSquareMetre: number,
  size: SeedSize,
): number {
  return (
    seedsPerSquareMetre * gramsPerSeed(size, 'kilogramsPerHectareFromSeedsPerSquareMetre') * 10
  );
}

/** Seeds per m² from kg/ha (inverse of kilogramsPerHectareFromSeedsPerSquareMetre). */
export function seedsPerSquareMetreFromKilogramsPerHectare(
  kilogramsPerHectare: number,
  size: SeedSize,
): number {
  return (
    kilogramsPerHectare / (gramsPerSeed(size, 'seedsPerSquareMetreFromKilogramsPerHectare') * 10)
  );
}

/**
 * Pure live seeds to sow for a target stand: plants ÷ (germination × expected emergence), the
 * seed-count form [NDSU-B; SDSU; ISU-O]. Emergence is 100 − stand loss (10–20 % in a good
 * seedbed [NDSU-B]; it rises with rate [MB-TCM], so count the stand).
 *
 * @param targetPlants - plants per unit area (any unit; the result is per the same unit)
 * @param germinationPercent - seed-tag germination, %
 * @param emergencePercent - expected share of live seeds that establish, %
 * @returns seeds to sow per the same unit area
 * @throws Error unless 0 < germination, emergence ≤ 100 and plants ≥ 0
 * @example seedsToSow(1_100_000, 95, 85) // 1,362,229 seeds/ac (NDSU-B barley example)
 */
export function seedsToSow(
  targetPlants: number,
  germinationPercent: number,
  emergencePercent: number,
): number {
  if (!(targetPlants >= 0)) throw new Error('seedsToSow needs target plants ≥ 0');
  if (!(germinationPercent > 0 && germinationPercent <= 100))
    throw new Error('seedsToSow needs 0 < germination % ≤ 100');
  if (!(emergencePercent > 0 && emergencePercent <= 100))
    throw new Error('seedsToSow needs 0 < emergence % ≤ 100');
  return targetPlants / ((germinationPercent / 100) * (emergencePercent / 100));
}

/**
 * Seeding rate in lb/ac for a target stand in plants per ft²: seedsToSow then
 * poundsPerAcreFromSeedsPerSquareFoot.
 * @example seedingRatePoundsPerAcre({ plantsPerSquareFoot: 20, germinationPercent: 93, emergencePercent: 97, size: { thousandKernelWeightGrams: 33 } }) // ≈ 70 (NDSU-R)
 */
export function seedingRatePoundsPerAcre(input: {
  plantsPerSquareFoot: number;
  germinationPercent: number;
  emergencePercent: number;
  size: SeedSize;
}): number {
  const seeds = seedsToSow(
    input.plantsPerSquareFoot,
    input.germinationPercent,
    input.emergencePercent,
  );
  return poundsPerAcreFromSeedsPerSquareFoot(seeds, input.size);
}

/**
 * Seed for one strip: rows × length at a given seeds per foot of row.
 * @param input - seeds per foot of row, number of rows, strip length (ft), seed size
 * @returns seeds and grams per row and per strip
 * @example seedForStrip({ seedsPerFootOfRow: 10, rows: 6, lengthFeet: 100, size: { thousandKernelWeightGrams: 40 } }).gramsPerStrip // 240
 */
export function seedForStrip(input: {
  seedsPerFootOfRow: number;
  rows: number;
  lengthFeet: number;
  size: SeedSize;
}): {
  seedsPerRow: number;
  gramsPerRow: number;
  seedsPerStrip: number;
  gramsPerStrip: number;
} {
  if (!(input.rows >= 1) || !Number.isInteger(input.rows))
    throw new Error('seedForStrip needs a whole number of rows ≥ 1');
  positive(input.lengthFeet, 'a strip length', 'seedForStrip');
  const grams = gramsPerSeed(input.size, 'seedForStrip');
  const seedsPerRow = input.seedsPerFootOfRow * input.lengthFeet;
  return {
    seedsPerRow,
    gramsPerRow: seedsPerRow * grams,
    seedsPerStrip: seedsPerRow * input.rows,
    gramsPerStrip: seedsPerRow * input.rows * grams,
  };
}
