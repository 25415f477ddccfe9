// The calculators' boxes as zod schemas: text read by parseDecimal, checked by the API's
// calculator schemas (the same ones POST /api/calc/* parses).
import { z } from 'zod';
import {
  CalcUnitSchema,
  CalibrationCalcInputSchema,
  SeedingCalcInputSchema,
} from '../../../../shared/schemas/calc';
import type { UnitSystem } from '../../../../shared/schemas/trial';
import { METRES_PER_FOOT, SQUARE_FEET_PER_SQUARE_METRE } from '../../../../shared/units/constants';
import { designUnits } from '../../../../shared/units/design-units';
import { numberText, type DisplayUnit } from '../../../lib/forms/number-text';

const seeding = SeedingCalcInputSchema.shape;

export const SeedCalcFormSchema = z
  .object({
    value: numberText(seeding.value),
    unit: CalcUnitSchema,
    sizeMode: z.enum(['tkw', 'seedsPerLb']),
    thousandKernelWeightG: z.string(),
    seedsPerLb: z.string(),
    germinationPct: numberText(seeding.germinationPct),
    emergencePct: numberText(seeding.emergencePct),
    rowSpacingIn: numberText(seeding.rowSpacingIn),
    rowsPerStrip: numberText(seeding.rowsPerStrip),
    stripLengthFt: numberText(seeding.stripLengthFt),
    wheelCircumferenceFt: numberText(seeding.wheelCircumferenceFt),
  })
  // Only the seed-size box that is shown counts; the other may hold an old value.
  .transform(
    (
      { sizeMode, thousandKernelWeightG, seedsPerLb, ...rest },
      ctx,
    ): z.input<typeof SeedingCalcInputSchema> => {
      const box = sizeMode === 'tkw' ? 'thousandKernelWeightG' : 'seedsPerLb';
      const schema = numberText(
        sizeMode === 'tkw' ? seeding.thousandKernelWeightG.unwrap() : seeding.seedsPerLb.unwrap(),
      );
      const size = schema.safeParse(sizeMode === 'tkw' ? thousandKernelWeightG : seedsPerLb);
      if (!size.success) {
        for (const issue of size.error.issues)
          ctx.addIssue({ code: 'custom', message: issue.message, path: [box] });
        return z.NEVER;
      }
      return { ...rest, [box]: size.data };
    },
  )
  .pipe(SeedingCalcInputSchema);

export type SeedCalcFormValues = z.input<typeof SeedCalcFormSchema>;

export const SEED_CALC_DEFAULTS: SeedCalcFormValues = {
  value: '96',
  unit: 'lb/acre',
  sizeMode: 'tkw',
  thousandKernelWeightG: '32',
  seedsPerLb: '',
  germinationPct: '95',
  emergencePct: '85',
  rowSpacingIn: '8',
  rowsPerStrip: '6',
  stripLengthFt: '100',
  wheelCircumferenceFt: '3',
};

const calibration = CalibrationCalcInputSchema.shape;

/**
 * The units the seeder check is typed in: a metric trial's grower measures the wheel in metres,
 * the rows in centimetres and the target in seeds per metre of row; the API keeps feet, inches
 * and seeds per foot (1 ft = 0.3048 m, 1 in = 2.54 cm, exact).
 */
export function calibrationUnits(system: UnitSystem) {
  const design = designUnits(system);
  const metric = system === 'metric';
  const perLength: DisplayUnit = metric
    ? {
        unit: 'seeds/m',
        toStored: (perMetre) => perMetre * METRES_PER_FOOT,
        fromStored: (perFoot) => perFoot / METRES_PER_FOOT,
      }
    : { unit: 'seeds/ft', toStored: (v) => v, fromStored: (v) => v };
  const perArea: DisplayUnit = metric
    ? {
        unit: 'm²',
        toStored: (perSquareMetre) => perSquareMetre / SQUARE_FEET_PER_SQUARE_METRE,
        fromStored: (perSquareFoot) => perSquareFoot * SQUARE_FEET_PER_SQUARE_METRE,
      }
    : { unit: 'ft²', toStored: (v) => v, fromStored: (v) => v };
  return {
    system,
    circumference: design.stripLength,
    rowSpacing: design.rowSpacing,
    target: perLength,
    area: perArea,
    lengthWord: metric ? 'metre' : 'foot',
  };
}

export type CalibrationUnits = ReturnType<typeof calibrationUnits>;

/** The seeder check's boxes in a unit system; the output is in the API's (stored) units. */
export function calibrationFormSchema(system: UnitSystem) {
  const units = calibrationUnits(system);
  return z.object({
    wheelCircumferenceFt: numberText(calibration.wheelCircumferenceFt, units.circumference),
    wheelTurns: numberText(calibration.wheelTurns),
    seedsCounted: numberText(calibration.seedsCounted),
    rowSpacingIn: numberText(calibration.rowSpacingIn, units.rowSpacing),
    targetSeedsPerFootOfRow: numberText(calibration.targetSeedsPerFootOfRow, units.target),
  });
}

export const CalibrationFormSchema = calibrationFormSchema('imperial');

export type CalibrationFormValues = z.input<typeof CalibrationFormSchema>;

/** Starting values: a 3-ft (or 1-m) wheel, 5 turns, 8-inch (or 20-cm) rows. */
export function calibrationDefaults(system: UnitSystem): CalibrationFormValues {
  return system === 'metric'
    ? {
        wheelCircumferenceFt: '1',
        wheelTurns: '5',
        seedsCounted: '',
        rowSpacingIn: '20',
        targetSeedsPerFootOfRow: '30',
      }
    : {
        wheelCircumferenceFt: '3',
        wheelTurns: '5',
        seedsCounted: '',
        rowSpacingIn: '8',
        targetSeedsPerFootOfRow: '10',
      };
}

export const CALIBRATION_DEFAULTS = calibrationDefaults('imperial');
