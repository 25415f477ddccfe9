import { describe, expect, it } from 'vitest';
import { SeedingCalcInputSchema } from '../../../shared/schemas/calc';
import { calculateSeeding } from '../../../shared/design/seeding-calc';
import { rateTable } from '../../../shared/design/rate-table';

const calc = (input: Record<string, unknown>) =>
  calculateSeeding(SeedingCalcInputSchema.parse(input));

describe('calculateSeeding', () => {
  it('turns 10 seeds per foot of 8-inch rows into 15 seeds/ft²', () => {
    // Common practice, no published source (formula: UKY-S; PSU-WS).
    const result = calc({
      value: 10,
      unit: 'seeds/ft-row',
      rowSpacingIn: 8,
      thousandKernelWeightG: 40,
    });
    expect(result.seedsPerSquareFoot).toBeCloseTo(15, 10);
    expect(result.seedsPerSquareMetre).toBeCloseTo(161.46, 2);
  });

  it('gives 30 seeds per turn of a 3-ft wheel at 10 seeds/ft', () => {
    // Common practice, no published source.
    const result = calc({
      value: 15,
      unit: 'seeds/ft2',
      rowSpacingIn: 8,
      thousandKernelWeightG: 40,
      wheelCircumferenceFt: 3,
    });
    expect(result.seedsPerWheelTurn).toBeCloseTo(30, 10);
  });

  it('reproduces the NDSU barley seeding-rate example (≈110 lb/ac; 109.0 recomputed)', () => {
    // Source: NDSU Extension barley seeding rates [NDSU-B]: 1.1 M plants/ac, 12,500 seeds/lb,
    // 95 % germination, 15 % stand loss.
    const result = calc({
      value: 1_100_000,
      unit: 'plants/acre',
      seedsPerLb: 12_500,
      germinationPct: 95,
      emergencePct: 85,
      rowSpacingIn: 7,
    });
    expect(result.poundsPerAcre).toBeCloseTo(108.98, 1);
    expect(result.expectedPlantsPerSquareFoot * 43_560).toBeCloseTo(1_100_000, -2);
  });

  it('reproduces the NDSU fall-rye example: 20 plants/ft², 93 % germination, 3 % mortality, 33 g → about 70 lb/ac', () => {
    // Source: NDSU Extension, winter rye seeding rate [NDSU-R].
    const result = calc({
      value: 20,
      unit: 'plants/ft2',
      thousandKernelWeightG: 33,
      germinationPct: 93,
      emergencePct: 97,
      rowSpacingIn: 7.5,
    });
    expect(result.seedsPerSquareFoot).toBeCloseTo(22.2, 1);
    expect(Math.round(result.poundsPerAcre)).toBe(70);
  });

  it('round-trips lb/acre and kg/ha (1 lb/ac = 1.12 kg/ha)', () => {
    // Source: Utah State Extension unit constants [USU]: 1 lb/ac = 1.12 kg/ha.
    const result = calc({
      value: 100,
      unit: 'lb/acre',
      thousandKernelWeightG: 38,
      rowSpacingIn: 8,
    });
    expect(result.kilogramsPerHectare).toBeCloseTo(112.085, 2);
    const back = calc({
      value: result.kilogramsPerHectare,
      unit: 'kg/ha',
      thousandKernelWeightG: 38,
      rowSpacingIn: 8,
    });
    expect(back.poundsPerAcre).toBeCloseTo(100, 8);
  });

  it('treats seeds per lb and thousand-kernel weight as the same seed size', () => {
    const byWeight = calc({
      value: 90,
      unit: 'lb/acre',
      thousandKernelWeightG: 453.59237 / 14,
      rowSpacingIn: 8,
    });
    const byCount = calc({ value: 90, unit: 'lb/acre', seedsPerLb: 14_000, rowSpacingIn: 8 });
    expect(byCount.seedsPerSquareFoot).toBeCloseTo(byWeight.seedsPerSquareFoot, 8);
  });
});

describe('rateTable', () => {
  const levels = [
    { multiplier: 0.25, label: 'quarter' },
    { multiplier: 0.5, label: 'half' },
    { multiplier: 1, label: 'full' },
    { multiplier: 2, label: 'double' },
  ];
  const design = (referenceRate: number) => ({
    referenceRate,
    referenceUnit: 'lb/acre',
    rowSpacingIn: 8,
    rowsPerStrip: 6,
    stripLengthFt: 100,
    thousandKernelWeightG: 38,
    rateLevels: levels,
  });

  it('gives quarter, half, full and double of 80 and of 120 lb/acre', () => {
    // Common practice for conventional drilled small grain: 80–120 lb/acre full rate.
    expect(rateTable(design(80)).map((r) => Math.round(r.poundsPerAcre * 1e6) / 1e6)).toEqual([
      20, 40, 80, 160,
    ]);
    expect(rateTable(design(120)).map((r) => Math.round(r.poundsPerAcre * 1e6) / 1e6)).toEqual([
      30, 60, 120, 240,
    ]);
  });

  it('gives grams per strip proportional to the rate', () => {
    const rows = rateTable(design(96));
    // 96 lb/acre on 400 ft² of strip = 96 × 453.59 × 400 ÷ 43,560 = 399.9 g (derived).
    expect(rows.find((r) => r.label === 'full')!.gramsPerStrip).toBeCloseTo(399.87, 1);
    expect(rows.find((r) => r.label === 'half')!.gramsPerStrip).toBeCloseTo(199.94, 1);
  });

  it('is empty while the design lacks the seed lot', () => {
    expect(rateTable({ ...design(80), thousandKernelWeightG: null })).toEqual([]);
  });
});
