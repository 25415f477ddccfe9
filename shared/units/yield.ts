// Yield at standard moisture, per-area counts, establishment and seed return.
import {
  ACRES_PER_HECTARE,
  GRAMS_PER_POUND,
  INCHES_PER_FOOT,
  METRES_PER_FOOT,
  SQUARE_FEET_PER_ACRE,
  SQUARE_FEET_PER_SQUARE_METRE,
} from './constants';
import { CROPS, type CropKey } from './crops';

/**
 * Grain weight at a standard moisture: weight × (100 − measured %) ÷ (100 − standard %) [EDIS].
 * @example weightAtStandardMoisture(1000, 18, 13.5) // 947.98
 */
export function weightAtStandardMoisture(
  weight: number,
  measuredPercent: number,
  standardPercent: number,
): number {
  if (!(weight >= 0)) throw new Error('weightAtStandardMoisture needs a weight ≥ 0');
  if (
    !(measuredPercent >= 0 && measuredPercent < 100) ||
    !(standardPercent >= 0 && standardPercent < 100)
  ) {
    throw new Error('weightAtStandardMoisture needs moisture percentages in [0, 100)');
  }
  return (weight * (100 - measuredPercent)) / (100 - standardPercent);
}

/**
 * Yield of a strip from threshed weight and harvested area, at the crop's standard moisture.
 *
 * @param input - grain weight (g), harvested area (ft²), measured moisture % and crop
 * @returns bu/ac, kg/ha and the adjusted weight (g); plus a warning when outside the crop's usual range
 * @throws Error for non-positive area, bad moisture, or an unknown crop
 * @example stripYield({ grainGrams: 20_000, areaSquareFeet: 600, moisturePercent: 13.5, crop: 'wheat' }).bushelsPerAcre // 53.4
 */
export function stripYield(input: {
  grainGrams: number;
  areaSquareFeet: number;
  moisturePercent: number;
  crop: CropKey;
}): {
  bushelsPerAcre: number;
  kilogramsPerHectare: number;
  gramsAtStandardMoisture: number;
  warning?: string;
} {
  const crop = CROPS[input.crop];
  if (!crop) throw new Error(`stripYield: unknown crop "${input.crop}"`);
  if (!(input.areaSquareFeet > 0)) throw new Error('stripYield needs a harvested area > 0');
  const grams = weightAtStandardMoisture(
    input.grainGrams,
    input.moisturePercent,
    crop.standardMoisturePercent,
  );
  const poundsPerAcre = (grams / GRAMS_PER_POUND) * (SQUARE_FEET_PER_ACRE / input.areaSquareFeet);
  const bushelsPerAcre = poundsPerAcre / crop.bushelPounds;
  const kilogramsPerHectare =
    (grams / 1000) * ((10_000 * SQUARE_FEET_PER_SQUARE_METRE) / input.areaSquareFeet);
  const result: {
    bushelsPerAcre: number;
    kilogramsPerHectare: number;
    gramsAtStandardMoisture: number;
    warning?: string;
  } = {
    bushelsPerAcre,
    kilogramsPerHectare,
    gramsAtStandardMoisture: grams,
  };
  const { low, high } = crop.usualYieldBushelsPerAcre;
  if (bushelsPerAcre < low || bushelsPerAcre > high) {
    result.warning = `${bushelsPerAcre.toFixed(1)} bu/ac is outside the usual ${low}–${high} bu/ac for ${crop.name.toLowerCase()}: check the weight and the area.`;
  }
  return result;
}

/**
 * Plants (or tillers, heads) per ft² and per m² from counts on measured row lengths:
 * total count ÷ (total row length × row spacing) [PSU-WS: count in 3 ft × 4 ÷ row width (in)].
 *
 * @param input - counts per subsample, row length of each subsample (ft), row spacing (in)
 * @returns per ft² and per m²
 * @throws Error for empty counts or non-positive length or spacing
 * @example countPerArea({ counts: [45], rowLengthFeet: 3, rowSpacingInches: 7.5 }).perSquareFoot // 24
 */
export function countPerArea(input: {
  counts: readonly number[];
  rowLengthFeet: number;
  rowSpacingInches: number;
}): {
  perSquareFoot: number;
  perSquareMetre: number;
} {
  if (input.counts.length === 0) throw new Error('countPerArea needs at least one count');
  if (!(input.rowLengthFeet > 0) || !(input.rowSpacingInches > 0))
    throw new Error('countPerArea needs row length and spacing > 0');
  const total = input.counts.reduce((a, b) => a + b, 0);
  const areaSquareFeet =
    input.counts.length * input.rowLengthFeet * (input.rowSpacingInches / INCHES_PER_FOOT);
  const perSquareFoot = total / areaSquareFeet;
  return { perSquareFoot, perSquareMetre: perSquareFoot * SQUARE_FEET_PER_SQUARE_METRE };
}

/** Establishment %: plants per area ÷ seeds sown per same area × 100. @example establishmentPercent(18, 24) // 75 */
export function establishmentPercent(plantsPerArea: number, seedsSownPerArea: number): number {
  if (!(seedsSownPerArea > 0)) throw new Error('establishmentPercent needs seeds sown > 0');
  return (100 * plantsPerArea) / seedsSownPerArea;
}

/**
 * Seed return: grain harvested per unit of seed sown (same weight unit per same area).
 * @example seedReturn(3600, 120) // 30 (lb grain per lb seed)
 */
export function seedReturn(grainPerArea: number, seedPerArea: number): number {
  if (!(seedPerArea > 0)) throw new Error('seedReturn needs seed sown > 0');
  return grainPerArea / seedPerArea;
}

/** bu/ac → kg/ha for a crop (bushel weight × 1.12085). @example bushelsPerAcreToKilogramsPerHectare(50, 'oats') // 1793.4 */
export function bushelsPerAcreToKilogramsPerHectare(bushelsPerAcre: number, crop: CropKey): number {
  const entry = CROPS[crop];
  if (!entry) throw new Error(`bushelsPerAcreToKilogramsPerHectare: unknown crop "${crop}"`);
  return bushelsPerAcre * entry.bushelPounds * (GRAMS_PER_POUND / 1000) * ACRES_PER_HECTARE;
}

/** Metres of row from feet (exact 0.3048). @example feetToMetres(100) // 30.48 */
export function feetToMetres(feet: number): number {
  return feet * METRES_PER_FOOT;
}
