// What a grower records on one strip, in the trial's unit system (imperial: ft, lb, ft²;
// metric: m, kg, m²), plus the derived values shown beside it.
import { z } from 'zod';
import { IsoDateSchema } from './common';

const count = z
  .number()
  .int('Use a whole number')
  .min(0, 'Cannot be negative')
  .max(100000, 'Too large');
const positiveLength = z.number().positive('Must be above 0').max(10000, 'Too long');

export const ObservationValuesSchema = z.object({
  seedsSown: count.nullable(),
  standCounts: z.array(count).max(6, 'Up to 6 stand-count subsamples'),
  standRowLength: positiveLength.nullable(),
  tillerPlants: count.nullable(),
  tillerCount: count.nullable(),
  headCounts: z.array(count).max(6, 'Up to 6 head-count subsamples'),
  headRowLength: positiveLength.nullable(),
  grainWeight: z.number().min(0, 'Cannot be negative').max(100000, 'Too large').nullable(),
  harvestRows: z.number().int('Use a whole number').min(1, 'At least 1 row').max(200).nullable(),
  harvestLength: positiveLength.nullable(),
  harvestArea: z.number().positive('Must be above 0').max(1_000_000).nullable(),
  moisturePct: z.number().min(0, 'Cannot be negative').max(60, 'At most 60 %').nullable(),
  testWeight: z.number().positive('Must be above 0').max(120, 'Too large').nullable(),
  sowingDate: IsoDateSchema.nullable(),
  emergenceDate: IsoDateSchema.nullable(),
  headingDate: IsoDateSchema.nullable(),
  harvestDate: IsoDateSchema.nullable(),
  notes: z.string().max(4000, 'At most 4,000 characters'),
});
export type ObservationValues = z.infer<typeof ObservationValuesSchema>;

export const EMPTY_OBSERVATION: ObservationValues = {
  seedsSown: null,
  standCounts: [],
  standRowLength: null,
  tillerPlants: null,
  tillerCount: null,
  headCounts: [],
  headRowLength: null,
  grainWeight: null,
  harvestRows: null,
  harvestLength: null,
  harvestArea: null,
  moisturePct: null,
  testWeight: null,
  sowingDate: null,
  emergenceDate: null,
  headingDate: null,
  harvestDate: null,
  notes: '',
};

export const DerivedValuesSchema = z.object({
  targetSeedsPerSquareFoot: z.number().nullable(),
  plantsPerSquareFoot: z.number().nullable(),
  plantsPerSquareMetre: z.number().nullable(),
  establishmentPercent: z.number().nullable(),
  tillersPerPlant: z.number().nullable(),
  headsPerSquareFoot: z.number().nullable(),
  headsPerSquareMetre: z.number().nullable(),
  headsPerPlant: z.number().nullable(),
  harvestedAreaSquareFeet: z.number().nullable(),
  yieldBushelsPerAcre: z.number().nullable(),
  yieldKilogramsPerHectare: z.number().nullable(),
  seedPoundsPerAcre: z.number().nullable(),
  seedReturn: z.number().nullable(),
  returnOverSeedCostPerAcre: z.number().nullable(),
});
export type DerivedValues = z.infer<typeof DerivedValuesSchema>;
