// What the trial wizard's boxes hold, how they become the API's design fields (in the stored
// units), and the zod schema each step is validated with: the API's own field schemas.
import { z } from 'zod';
import {
  CropKeySchema,
  CustomCropSchema,
  DEFAULT_RATE_LEVELS,
  RateLevelSchema,
  RateUnitSchema,
  TrialDesignSchema,
  UnitSystemSchema,
  type CropKey,
  type RateUnit,
  type TrialDetail,
  type UnitSystem,
  type UpdateTrialInput,
} from '../../../../shared/schemas/trial';
import { GRAMS_PER_POUND, KG_PER_HA_PER_LB_PER_ACRE } from '../../../../shared/units/constants';
import { CROPS } from '../../../../shared/units/crops';
import { designUnits, grainPriceUnit } from '../../../../shared/units/design-units';
import { parseDecimal } from '../../../../shared/units/parse-decimal';
import { choiceText, numberText, type DisplayUnit } from '../../../lib/forms/number-text';

export const STEPS = [
  'Crop and season',
  'Rates',
  'Strips and blocks',
  'Seed lot and prices',
  'Summary',
] as const;

export interface WizardValues {
  networkId: string;
  name: string;
  question: string;
  crop: CropKey | '';
  season: string;
  unitSystem: UnitSystem;
  customName: string;
  customTkw: string;
  customBushel: string;
  customMoisture: string;
  referenceRate: string;
  referenceUnit: RateUnit;
  levels: { multiplier: string; label: string }[];
  blocksPerSite: string;
  rowsPerStrip: string;
  rowSpacing: string;
  stripLength: string;
  borderRows: string;
  seedSize: 'tkw' | 'seedsPerLb';
  tkw: string;
  seedsPerLb: string;
  germinationPct: string;
  emergencePct: string;
  seedPrice: string;
  grainPrice: string;
}

const shownFormat = new Intl.NumberFormat('en', { maximumFractionDigits: 2, useGrouping: false });
const shown = (value: number | null | undefined, unit?: DisplayUnit) =>
  value === null || value === undefined
    ? ''
    : shownFormat.format(unit ? unit.fromStored(value) : value);

/** A value read leniently (for drafts): undefined when empty or not a number. */
const read = (text: string): number | undefined => {
  const parsed = parseDecimal(text);
  return parsed.ok && parsed.value !== null ? parsed.value : undefined;
};

/** Bushel weight of the chosen crop, lb (for grain prices per tonne). */
export function bushelPounds(values: Pick<WizardValues, 'crop' | 'customBushel' | 'unitSystem'>) {
  if (values.crop === 'custom') {
    const typed = read(values.customBushel);
    return typed === undefined ? null : designUnits(values.unitSystem).bushelWeight.toStored(typed);
  }
  return values.crop ? CROPS[values.crop].bushelPounds : null;
}

/** The units each box takes in this design's unit system. */
export function wizardUnits(values: Pick<WizardValues, 'crop' | 'customBushel' | 'unitSystem'>) {
  const units = designUnits(values.unitSystem);
  return { ...units, grainPrice: grainPriceUnit(values.unitSystem, bushelPounds(values)) };
}

export function initialValues(trial: TrialDetail | undefined, networkId: string): WizardValues {
  const unitSystem = trial?.unitSystem ?? 'imperial';
  const values = { crop: trial?.crop ?? '', unitSystem, customBushel: '' } as const;
  const units = wizardUnits(values);
  const bushel = trial?.customCrop?.bushelWeightLb;
  return {
    networkId,
    name: trial?.name ?? '',
    question: trial?.question ?? '',
    crop: trial?.crop ?? '',
    season: trial?.season ?? String(new Date().getFullYear() + 1),
    unitSystem,
    customName: trial?.customCrop?.name ?? '',
    customTkw: shown(trial?.customCrop?.thousandKernelWeightG),
    customBushel: shown(bushel, units.bushelWeight),
    customMoisture: shown(trial?.customCrop?.standardMoisturePct),
    referenceRate: shown(trial?.referenceRate),
    referenceUnit: trial?.referenceUnit ?? units.defaultRateUnit,
    levels: (trial?.rateLevels.length ? trial.rateLevels : DEFAULT_RATE_LEVELS).map((l) => ({
      multiplier: String(l.multiplier),
      label: l.label,
    })),
    blocksPerSite: trial ? shown(trial.blocksPerSite) : '4',
    rowsPerStrip: shown(trial?.rowsPerStrip),
    rowSpacing: trial ? shown(trial.rowSpacingIn, units.rowSpacing) : shown(8, units.rowSpacing),
    stripLength: shown(trial?.stripLengthFt, units.stripLength),
    borderRows: trial ? shown(trial.borderRows) : '1',
    seedSize: 'tkw',
    tkw: shown(trial?.thousandKernelWeightG),
    seedsPerLb: trial?.thousandKernelWeightG
      ? String(
          Math.round(
            units.seedCount.fromStored((1000 * GRAMS_PER_POUND) / trial.thousandKernelWeightG),
          ),
        )
      : '',
    germinationPct: shown(trial?.germinationPct),
    emergencePct: trial ? shown(trial.emergencePct) : '85',
    seedPrice: shown(trial?.seedPricePerLb, units.seedPrice),
    grainPrice: shown(
      trial?.grainPricePerBu,
      wizardUnits({ ...values, customBushel: '' }).grainPrice,
    ),
  };
}

/** The boxes that hold a quantity in the unit system's units, rewritten when the system changes. */
export function switchUnitSystem(values: WizardValues, next: UnitSystem): Partial<WizardValues> {
  if (next === values.unitSystem) return {};
  const from = wizardUnits(values);
  const to = wizardUnits({ ...values, unitSystem: next });
  const convert = (text: string, a: DisplayUnit, b: DisplayUnit) => {
    const value = read(text);
    return value === undefined ? text : shown(a.toStored(value), b);
  };
  const patch: Partial<WizardValues> = {
    unitSystem: next,
    rowSpacing: convert(values.rowSpacing, from.rowSpacing, to.rowSpacing),
    stripLength: convert(values.stripLength, from.stripLength, to.stripLength),
    seedPrice: convert(values.seedPrice, from.seedPrice, to.seedPrice),
    grainPrice: convert(values.grainPrice, from.grainPrice, to.grainPrice),
    customBushel: convert(values.customBushel, from.bushelWeight, to.bushelWeight),
    seedsPerLb: convert(values.seedsPerLb, from.seedCount, to.seedCount),
  };
  // A rate still in the old system's usual unit follows it (lb/acre ↔ kg/ha).
  const rate = read(values.referenceRate);
  if (values.referenceUnit === from.defaultRateUnit) {
    patch.referenceUnit = to.defaultRateUnit;
    if (rate !== undefined)
      patch.referenceRate = shownFormat.format(
        next === 'metric' ? rate * KG_PER_HA_PER_LB_PER_ACRE : rate / KG_PER_HA_PER_LB_PER_ACRE,
      );
  }
  return patch;
}

/** The design as typed so far, in stored units: empty or unreadable boxes left out (a draft). */
export function toPayload(values: WizardValues): UpdateTrialInput {
  const units = wizardUnits(values);
  const inUnit = (text: string, unit: DisplayUnit) => {
    const value = read(text);
    return value === undefined ? undefined : unit.toStored(value);
  };
  const perLb = inUnit(values.seedsPerLb, units.seedCount);
  const payload: Record<string, unknown> = {
    name: values.name,
    question: values.question,
    season: values.season || undefined,
    crop: values.crop || undefined,
    unitSystem: values.unitSystem,
    referenceRate: read(values.referenceRate),
    referenceUnit: values.referenceUnit,
    rateLevels: values.levels
      .map((l) => ({ multiplier: read(l.multiplier), label: l.label }))
      .filter((l) => l.multiplier !== undefined),
    blocksPerSite: read(values.blocksPerSite),
    rowsPerStrip: read(values.rowsPerStrip),
    rowSpacingIn: inUnit(values.rowSpacing, units.rowSpacing),
    stripLengthFt: inUnit(values.stripLength, units.stripLength),
    borderRows: read(values.borderRows),
    thousandKernelWeightG:
      values.seedSize === 'tkw'
        ? read(values.tkw)
        : perLb && perLb > 0
          ? Math.round(((1000 * GRAMS_PER_POUND) / perLb) * 100) / 100
          : undefined,
    germinationPct: read(values.germinationPct),
    emergencePct: read(values.emergencePct),
    seedPricePerLb: inUnit(values.seedPrice, units.seedPrice),
    grainPricePerBu: inUnit(values.grainPrice, units.grainPrice),
  };
  if (values.crop === 'custom') {
    payload.customCrop = {
      name: values.customName,
      thousandKernelWeightG: read(values.customTkw),
      bushelWeightLb: inUnit(values.customBushel, units.bushelWeight),
      standardMoisturePct: read(values.customMoisture),
    };
  }
  return Object.fromEntries(
    Object.entries(payload).filter(([, v]) => v !== undefined),
  ) as UpdateTrialInput;
}

const design = TrialDesignSchema.shape;
const rateLevels = design.rateLevels.unwrap();

/** Step schemas over the boxes; each field's bounds and messages are the API's. */
export function stepSchema(
  step: number,
  values: WizardValues,
): z.ZodType<Record<string, unknown>, Record<string, unknown>> | null {
  const units = wizardUnits(values);
  switch (step) {
    case 0:
      return z.object({
        name: design.name,
        question: design.question,
        crop: choiceText(CropKeySchema, 'Choose a crop'),
        season: design.season,
        unitSystem: UnitSystemSchema,
        ...(values.crop === 'custom'
          ? {
              customName: CustomCropSchema.shape.name,
              customTkw: numberText(CustomCropSchema.shape.thousandKernelWeightG),
              customBushel: numberText(CustomCropSchema.shape.bushelWeightLb, units.bushelWeight),
              customMoisture: numberText(CustomCropSchema.shape.standardMoisturePct),
            }
          : {}),
      });
    case 1:
      return z.object({
        referenceRate: numberText(design.referenceRate),
        referenceUnit: RateUnitSchema,
        levels: z
          .array(
            z.object({
              multiplier: numberText(RateLevelSchema.shape.multiplier),
              label: RateLevelSchema.shape.label,
            }),
          )
          .pipe(rateLevels),
      });
    case 2:
      return z.object({
        blocksPerSite: numberText(design.blocksPerSite),
        rowsPerStrip: numberText(design.rowsPerStrip),
        rowSpacing: numberText(design.rowSpacingIn, units.rowSpacing),
        stripLength: numberText(design.stripLengthFt, units.stripLength),
        borderRows: numberText(design.borderRows),
      });
    case 3:
      return z.object({
        ...(values.seedSize === 'tkw'
          ? { tkw: numberText(design.thousandKernelWeightG) }
          : {
              seedsPerLb: numberText(
                z.number().positive('Must be above 0').max(200_000),
                units.seedCount,
              ),
            }),
        germinationPct: numberText(design.germinationPct),
        emergencePct: numberText(design.emergencePct),
        seedPrice: numberText(design.seedPricePerLb, units.seedPrice),
        grainPrice: numberText(design.grainPricePerBu, units.grainPrice),
      });
    default:
      return null;
  }
}

/** The first step whose boxes do not pass, or null when the whole design is ready. */
export function firstInvalidStep(values: WizardValues): number | null {
  for (let step = 0; step < STEPS.length; step += 1) {
    const schema = stepSchema(step, values);
    if (schema && !schema.safeParse(values).success) return step;
  }
  return null;
}
