// Walk-behind seeder calibration: seeds per wheel turn and how far a count is from target.
import { seedsPerSquareFootFromRow } from './seeding-rate';

/**
 * Seeds a row unit should drop per turn of the drive wheel: seeds/ft × circumference (ft);
 * assumes no wheel slip [UKY-S, derived].
 * @example seedsPerWheelTurn(10, 3) // 30
 */
export function seedsPerWheelTurn(seedsPerFootOfRow: number, circumferenceFeet: number): number {
  if (!(circumferenceFeet > 0))
    throw new Error('seedsPerWheelTurn needs a wheel circumference > 0');
  if (!(seedsPerFootOfRow >= 0)) throw new Error('seedsPerWheelTurn needs seeds per foot ≥ 0');
  return seedsPerFootOfRow * circumferenceFeet;
}

export type CalibrationResult = {
  deliveredSeedsPerFootOfRow: number;
  deliveredSeedsPerSquareFoot: number;
  targetSeedsPerTurn: number;
  percentOfTarget: number;
  advice: string;
};

/**
 * Compares seeds caught over N wheel turns with the target and says what to change.
 * Within ±5 % is fine; otherwise the advice scales with how far off the count is.
 *
 * @param input - seeds counted, wheel turns, circumference (ft), row spacing (in), target seeds/ft of row
 * @returns delivered rate, percent of target and plain advice
 * @throws Error for non-positive turns, circumference, spacing or target
 * @example calibrateSeeder({ seedsCounted: 80, wheelTurns: 1, circumferenceFeet: 3, rowSpacingInches: 8, targetSeedsPerFootOfRow: 10 }).percentOfTarget // 266.7
 */
export function calibrateSeeder(input: {
  seedsCounted: number;
  wheelTurns: number;
  circumferenceFeet: number;
  rowSpacingInches: number;
  targetSeedsPerFootOfRow: number;
}): CalibrationResult {
  if (!(input.wheelTurns > 0)) throw new Error('calibrateSeeder needs wheel turns > 0');
  if (!(input.seedsCounted >= 0)) throw new Error('calibrateSeeder needs seeds counted ≥ 0');
  if (!(input.targetSeedsPerFootOfRow > 0)) throw new Error('calibrateSeeder needs a target > 0');
  const targetSeedsPerTurn = seedsPerWheelTurn(
    input.targetSeedsPerFootOfRow,
    input.circumferenceFeet,
  );
  const delivered = input.seedsCounted / (input.wheelTurns * input.circumferenceFeet);
  const ratio = delivered / input.targetSeedsPerFootOfRow;
  return {
    deliveredSeedsPerFootOfRow: delivered,
    deliveredSeedsPerSquareFoot: seedsPerSquareFootFromRow(delivered, input.rowSpacingInches),
    targetSeedsPerTurn,
    percentOfTarget: 100 * ratio,
    advice: calibrationAdvice(ratio),
  };
}

function calibrationAdvice(ratio: number): string {
  const percent = Math.round(100 * ratio);
  if (Math.abs(ratio - 1) <= 0.05) return `On target (${percent} % of target): no change needed.`;
  if (ratio === 0)
    return 'No seed came out: check the hopper, the drive and for blocked cups or tubes; re-check.';
  if (ratio >= 1.8 && ratio <= 2.2) {
    return `About double the target (${percent} %): close about half the cups/openings or pick the next smaller plate; re-check.`;
  }
  if (ratio > 2.2) {
    return `About ${ratio.toFixed(1)} times the target (${percent} %): close about ${Math.round(100 * (1 - 1 / ratio))} % of the cups/openings or pick a much smaller plate; re-check.`;
  }
  if (ratio > 1.05) {
    return `Too heavy by ${percent - 100} %: close the opening a step or use the next smaller plate; re-check.`;
  }
  if (ratio >= 0.4 && ratio <= 0.6) {
    return `About half the target (${percent} %): open about twice the cups/openings or pick the next larger plate; re-check.`;
  }
  if (ratio < 0.4) {
    return `Far too light (${percent} %): check for blockages, then use a much larger plate or opening; re-check.`;
  }
  return `Too light by ${100 - percent} %: open the setting a step or use the next larger plate; re-check.`;
}
