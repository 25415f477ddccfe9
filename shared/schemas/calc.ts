// Seed calculator and seeder-calibration contracts (public: no sign-in needed).
import { z } from 'zod';
import { groupedDecimal } from '../labels/decimal-text';
import { RATE_UNITS } from './trial';

/** A target stand instead of a seeding rate: seeds are plants ÷ (germination × emergence). */
export const PLANT_UNITS = ['plants/ft2', 'plants/m2', 'plants/acre'] as const;
export const CALC_UNITS = [...RATE_UNITS, ...PLANT_UNITS] as const;
export const CalcUnitSchema = z.enum(CALC_UNITS);
export type CalcUnit = z.infer<typeof CalcUnitSchema>;

const optionalPositive = (max: number, unit: string) =>
  z
    .number()
    .positive('Must be above 0')
    .max(max, `At most ${groupedDecimal(max, 0)} ${unit}`)
    .optional();

export const SeedingCalcInputSchema = z
  .object({
    value: z.number({ error: 'Enter a number' }).positive('Must be above 0').max(10_000_000),
    unit: CalcUnitSchema,
    thousandKernelWeightG: optionalPositive(100, 'g'),
    seedsPerLb: optionalPositive(200_000, 'seeds/lb'),
    germinationPct: z.number().min(1, 'At least 1 %').max(100, 'At most 100 %').default(100),
    emergencePct: z.number().min(1, 'At least 1 %').max(100, 'At most 100 %').default(100),
    rowSpacingIn: z
      .number({ error: 'Enter the row spacing' })
      .positive('Must be above 0')
      .max(40, 'At most 40 in'),
    rowsPerStrip: z
      .number()
      .int('Use a whole number')
      .min(1, 'At least 1 row')
      .max(48, 'At most 48 rows')
      .optional(),
    stripLengthFt: optionalPositive(5000, 'ft'),
    wheelCircumferenceFt: optionalPositive(20, 'ft'),
  })
  .refine((i) => i.thousandKernelWeightG !== undefined || i.seedsPerLb !== undefined, {
    message: 'Give the thousand-kernel weight or seeds per lb of your seed lot',
    path: ['thousandKernelWeightG'],
  });
export type SeedingCalcInput = z.input<typeof SeedingCalcInputSchema>;
export type SeedingCalcParsed = z.output<typeof SeedingCalcInputSchema>;

export const SeedingCalcResultSchema = z.object({
  poundsPerAcre: z.number(),
  kilogramsPerHectare: z.number(),
  seedsPerSquareFoot: z.number(),
  seedsPerSquareMetre: z.number(),
  seedsPerFootOfRow: z.number(),
  seedsPerAcre: z.number(),
  thousandKernelWeightG: z.number(),
  seedsPerLb: z.number(),
  /** Seeds × germination × emergence. */
  expectedPlantsPerSquareFoot: z.number(),
  expectedPlantsPerSquareMetre: z.number(),
  perRow: z.object({ seeds: z.number(), grams: z.number() }).nullable(),
  perStrip: z.object({ seeds: z.number(), grams: z.number() }).nullable(),
  seedsPerWheelTurn: z.number().nullable(),
});
export type SeedingCalcResult = z.infer<typeof SeedingCalcResultSchema>;

export const CalibrationCalcInputSchema = z.object({
  seedsCounted: z
    .number({ error: 'Enter the seeds you counted' })
    .int('Count whole seeds')
    .min(0, 'At least 0')
    .max(1_000_000),
  wheelTurns: z
    .number({ error: 'Enter the wheel turns' })
    .int('Use a whole number of turns')
    .min(1, 'At least 1 turn')
    .max(200),
  wheelCircumferenceFt: z
    .number({ error: 'Enter the wheel circumference' })
    .positive('Must be above 0')
    .max(20, 'At most 20 ft'),
  rowSpacingIn: z
    .number({ error: 'Enter the row spacing' })
    .positive('Must be above 0')
    .max(40, 'At most 40 in'),
  targetSeedsPerFootOfRow: z
    .number({ error: 'Enter the target' })
    .positive('Must be above 0')
    .max(1000),
});
export type CalibrationCalcInput = z.infer<typeof CalibrationCalcInputSchema>;

export const CalibrationCalcResultSchema = z.object({
  deliveredSeedsPerFootOfRow: z.number(),
  deliveredSeedsPerSquareFoot: z.number(),
  targetSeedsPerTurn: z.number(),
  targetSeedsForRun: z.number(),
  percentOfTarget: z.number(),
  advice: z.string(),
});
export type CalibrationCalcResult = z.infer<typeof CalibrationCalcResultSchema>;
