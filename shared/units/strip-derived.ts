// Derived strip values (stand, tillers, heads, yield, seed return) from raw observations:
// the one place where the trial's imperial or metric entries are converted.
import type { DerivedValues, ObservationValues } from '../schemas/observation';
import type { CustomCrop, CropKey, RateUnit, UnitSystem } from '../schemas/trial';
import {
  INCHES_PER_FOOT,
  METRES_PER_FOOT,
  SQUARE_FEET_PER_ACRE,
  SQUARE_FEET_PER_SQUARE_METRE,
  GRAMS_PER_POUND,
  KG_PER_HA_PER_LB_PER_ACRE,
} from './constants';
import { CROPS } from './crops';
import { convertRate } from './rate-units';
import { weightAtStandardMoisture } from './yield';
import { outlierReason } from '../reports/plain-words';

export interface CropFacts {
  name: string;
  bushelPounds: number;
  standardMoisturePercent: number;
  usualYieldBushelsPerAcre: { low: number; high: number } | null;
}

/** Crop facts for a trial's crop, including a custom crop's own values. */
export function cropFacts(
  crop: CropKey | null | undefined,
  custom: CustomCrop | null | undefined,
): CropFacts | null {
  if (crop === 'custom') {
    if (!custom) return null;
    return {
      name: custom.name,
      bushelPounds: custom.bushelWeightLb,
      standardMoisturePercent: custom.standardMoisturePct,
      usualYieldBushelsPerAcre: null,
    };
  }
  if (!crop) return null;
  const entry = CROPS[crop];
  return entry
    ? {
        name: entry.name,
        bushelPounds: entry.bushelPounds,
        standardMoisturePercent: entry.standardMoisturePercent,
        usualYieldBushelsPerAcre: entry.usualYieldBushelsPerAcre,
      }
    : null;
}

/** What derivation needs to know about the trial and the strip's rate level. */
export interface StripContext {
  unitSystem: UnitSystem;
  crop: CropFacts | null;
  rowSpacingIn: number | null;
  thousandKernelWeightG: number | null;
  referenceRate: number | null;
  referenceUnit: RateUnit | null;
  multiplier: number;
  seedPricePerLb: number | null;
  grainPricePerBu: number | null;
}

const lengthToFeet = (value: number, system: UnitSystem) =>
  system === 'metric' ? value / METRES_PER_FOOT : value;
const areaToSquareFeet = (value: number, system: UnitSystem) =>
  system === 'metric' ? value * SQUARE_FEET_PER_SQUARE_METRE : value;
const weightToPounds = (value: number, system: UnitSystem) =>
  system === 'metric' ? (value * 1000) / GRAMS_PER_POUND : value;

function perSquareFoot(
  counts: readonly number[],
  rowLength: number | null,
  context: StripContext,
): number | null {
  if (counts.length === 0 || !rowLength || !context.rowSpacingIn) return null;
  const total = counts.reduce((a, b) => a + b, 0);
  const area =
    counts.length *
    lengthToFeet(rowLength, context.unitSystem) *
    (context.rowSpacingIn / INCHES_PER_FOOT);
  return total / area;
}

/**
 * Derives per-area and yield values for one strip. Per-area counts follow PSU-WS
 * (count ÷ (row length × row spacing)); yield follows the moisture adjustment
 * weight × (100 − measured) ÷ (100 − standard) [EDIS] and the crop's USDA bushel weight.
 * Missing inputs give null for what depends on them, never an error.
 */
export function deriveStripValues(obs: ObservationValues, context: StripContext): DerivedValues {
  let targetSeedsPerSquareFoot: number | null = null;
  let seedPoundsPerAcre: number | null = null;
  if (
    context.referenceRate &&
    context.referenceUnit &&
    context.thousandKernelWeightG &&
    context.rowSpacingIn
  ) {
    const rate = convertRate(context.referenceRate * context.multiplier, context.referenceUnit, {
      size: { thousandKernelWeightGrams: context.thousandKernelWeightG },
      rowSpacingInches: context.rowSpacingIn,
    });
    targetSeedsPerSquareFoot = rate.seedsPerSquareFoot;
    seedPoundsPerAcre = rate.poundsPerAcre;
  }
  const plantsPerSquareFoot = perSquareFoot(obs.standCounts, obs.standRowLength, context);
  const headsPerSquareFoot = perSquareFoot(obs.headCounts, obs.headRowLength, context);
  const tillersPerPlant =
    obs.tillerPlants && obs.tillerCount !== null ? obs.tillerCount / obs.tillerPlants : null;

  let harvestedAreaSquareFeet: number | null = null;
  if (obs.harvestArea)
    harvestedAreaSquareFeet = areaToSquareFeet(obs.harvestArea, context.unitSystem);
  else if (obs.harvestRows && obs.harvestLength && context.rowSpacingIn) {
    harvestedAreaSquareFeet =
      obs.harvestRows *
      (context.rowSpacingIn / INCHES_PER_FOOT) *
      lengthToFeet(obs.harvestLength, context.unitSystem);
  }

  let yieldBushelsPerAcre: number | null = null;
  let yieldKilogramsPerHectare: number | null = null;
  let seedReturn: number | null = null;
  let returnOverSeedCostPerAcre: number | null = null;
  if (
    obs.grainWeight !== null &&
    harvestedAreaSquareFeet &&
    context.crop &&
    obs.moisturePct !== null &&
    obs.moisturePct < 100
  ) {
    const pounds = weightAtStandardMoisture(
      weightToPounds(obs.grainWeight, context.unitSystem),
      obs.moisturePct,
      context.crop.standardMoisturePercent,
    );
    const poundsPerAcre = (pounds * SQUARE_FEET_PER_ACRE) / harvestedAreaSquareFeet;
    yieldBushelsPerAcre = poundsPerAcre / context.crop.bushelPounds;
    yieldKilogramsPerHectare = poundsPerAcre * KG_PER_HA_PER_LB_PER_ACRE;
    if (seedPoundsPerAcre) seedReturn = poundsPerAcre / seedPoundsPerAcre;
    if (
      seedPoundsPerAcre !== null &&
      context.grainPricePerBu !== null &&
      context.seedPricePerLb !== null
    ) {
      returnOverSeedCostPerAcre =
        yieldBushelsPerAcre * context.grainPricePerBu - seedPoundsPerAcre * context.seedPricePerLb;
    }
  }

  return {
    targetSeedsPerSquareFoot,
    plantsPerSquareFoot,
    plantsPerSquareMetre:
      plantsPerSquareFoot === null ? null : plantsPerSquareFoot * SQUARE_FEET_PER_SQUARE_METRE,
    establishmentPercent:
      plantsPerSquareFoot !== null && targetSeedsPerSquareFoot
        ? (100 * plantsPerSquareFoot) / targetSeedsPerSquareFoot
        : null,
    tillersPerPlant,
    headsPerSquareFoot,
    headsPerSquareMetre:
      headsPerSquareFoot === null ? null : headsPerSquareFoot * SQUARE_FEET_PER_SQUARE_METRE,
    headsPerPlant:
      headsPerSquareFoot !== null && plantsPerSquareFoot
        ? headsPerSquareFoot / plantsPerSquareFoot
        : null,
    harvestedAreaSquareFeet,
    yieldBushelsPerAcre,
    yieldKilogramsPerHectare,
    seedPoundsPerAcre,
    seedReturn,
    returnOverSeedCostPerAcre,
  };
}

/** Plausibility warnings for a strip (they never block saving). */
export function plausibilityWarnings(
  obs: ObservationValues,
  derived: DerivedValues,
  crop: CropFacts | null,
): string[] {
  const warnings: string[] = [];
  if (derived.establishmentPercent !== null && derived.establishmentPercent > 100) {
    warnings.push(
      `Establishment is ${derived.establishmentPercent.toFixed(0)} %: more plants than seeds sown. Check the count, the row length or the seed lot.`,
    );
  }
  if (
    derived.headsPerSquareFoot !== null &&
    derived.plantsPerSquareFoot !== null &&
    derived.headsPerSquareFoot < derived.plantsPerSquareFoot
  ) {
    warnings.push(
      'Fewer heads than plants: every plant normally carries at least one head. Check both counts.',
    );
  }
  if (obs.moisturePct !== null && (obs.moisturePct < 8 || obs.moisturePct > 35)) {
    warnings.push(
      `Grain moisture ${obs.moisturePct} % is outside 8–35 %: check the meter reading.`,
    );
  }
  const range = crop?.usualYieldBushelsPerAcre;
  if (
    range &&
    derived.yieldBushelsPerAcre !== null &&
    (derived.yieldBushelsPerAcre < range.low * 0.5 ||
      derived.yieldBushelsPerAcre > range.high * 1.2)
  ) {
    warnings.push(
      `Yield of ${derived.yieldBushelsPerAcre.toFixed(1)} bu/acre is far outside the usual ${range.low}–${range.high} bu/acre for ${crop!.name.toLowerCase()}: check the weight and the harvested area.`,
    );
  }
  return warnings;
}

/** Unit labels for what a grower enters in a trial's unit system. */
export interface EntryUnits {
  length: string;
  weight: string;
  area: string;
  testWeight: string;
}

export function entryUnits(system: UnitSystem): EntryUnits {
  return system === 'metric'
    ? { length: 'm', weight: 'kg', area: 'm²', testWeight: 'kg/hl' }
    : { length: 'ft', weight: 'lb', area: 'ft²', testWeight: 'lb/bu' };
}

/** Which measurement groups of a strip are complete enough to use. */
export function recordedGroups(obs: ObservationValues): {
  stand: boolean;
  tillers: boolean;
  heads: boolean;
  yield: boolean;
} {
  return {
    stand: obs.standCounts.length > 0 && obs.standRowLength !== null,
    tillers: obs.tillerPlants !== null && obs.tillerPlants > 0 && obs.tillerCount !== null,
    heads: obs.headCounts.length > 0 && obs.headRowLength !== null,
    yield:
      obs.grainWeight !== null &&
      obs.moisturePct !== null &&
      (obs.harvestArea !== null || (obs.harvestRows !== null && obs.harvestLength !== null)),
  };
}

/** One strip's yield for the outlier check; value null when not recorded. */
export interface StripYield {
  key: string;
  block: number;
  rate: string;
  value: number | null;
}

/** The outlier test's level: a strip is flagged when its Bonferroni-adjusted p is below it. */
const OUTLIER_ALPHA = 0.05;

/**
 * Strips whose yield is an outlier in their site, by the same rule as the site analysis: the
 * Bonferroni outlier test on externally studentized residuals of the RCBD fit (R's
 * `car::outlierTest`, as `analyzeSite` computes it), flagged when the adjusted p is below 0.05.
 * Returns each flagged strip's adjusted p; an empty map when the site cannot be analysed yet
 * (too few strips with a yield, a rate without data, no error df).
 *
 * @param strips - every strip of the site with its yield (null when not recorded)
 * @param analyze - the site analysis (`analyzeSite`), passed in so shared/units stays free of it
 * @returns strip key → Bonferroni-adjusted p of the flagged strips
 */
export function yieldOutliers(
  strips: readonly StripYield[],
  analyze: (rows: { block: string; rate: string; value: number | null }[]) => {
    residuals: { block: string; rate: string; pBonferroni?: number }[];
  },
): Map<string, number> {
  const found = new Map<string, number>();
  if (strips.filter((s) => s.value !== null).length < 4) return found;
  let residuals: { block: string; rate: string; pBonferroni?: number }[];
  try {
    residuals = analyze(
      strips.map((s) => ({ block: String(s.block), rate: s.rate, value: s.value })),
    ).residuals;
  } catch {
    return found;
  }
  for (const residual of residuals) {
    if (residual.pBonferroni === undefined || !(residual.pBonferroni < OUTLIER_ALPHA)) continue;
    const strip = strips.find(
      (s) => String(s.block) === residual.block && s.rate === residual.rate,
    );
    if (strip) found.set(strip.key, residual.pBonferroni);
  }
  return found;
}

/** The warning text for a yield outlier, with the outlier test's adjusted p. */
export function outlierWarning(pBonferroni: number): string {
  return `This strip's yield is ${outlierReason(pBonferroni)}: check the weight, moisture and harvested area.`;
}
