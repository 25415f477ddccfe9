// The calculators' boxes as zod schemas: text read by parseDecimal, checked by the API's
// calculator schemas (the same ones POST /api/calc/* parses).
import { z } from 'zod';
import {
  CalcUnitSchema,
  CalibrationCalcInputSchema,
  SeedingCalcInputSchema,
} from '../../../../shared/schemas/calc';
import { numberText } from '../../../lib/forms/number-text';

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

export const CalibrationFormSchema = z.object({
  wheelCircumferenceFt: numberText(calibration.wheelCircumferenceFt),
  wheelTurns: numberText(calibration.wheelTurns),
  seedsCounted: numberText(calibration.seedsCounted),
  rowSpacingIn: numberText(calibration.rowSpacingIn),
  targetSeedsPerFootOfRow: numberText(calibration.targetSeedsPerFootOfRow),
});

export type CalibrationFormValues = z.input<typeof CalibrationFormSchema>;

export const CALIBRATION_DEFAULTS: CalibrationFormValues = {
  wheelCircumferenceFt: '3',
  wheelTurns: '5',
  seedsCounted: '',
  rowSpacingIn: '8',
  targetSeedsPerFootOfRow: '10',
};
