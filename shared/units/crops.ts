// Small-grain crop table: bushel weight, standard moisture, seed size, usual yields and rates.
import { ACRES_PER_HECTARE, GRAMS_PER_POUND } from './constants';

export type CropKey = 'wheat' | 'springWheat' | 'oats' | 'hullessOats' | 'barley' | 'rye';

export type Crop = {
  name: string;
  /** USDA bushel weight, lb. */
  bushelPounds: number;
  /** Moisture % at which yields are reported. */
  standardMoisturePercent: number;
  /** Typical thousand-kernel weight, g (for defaults only: weigh your own seed). */
  typicalThousandKernelWeightGrams: number;
  /** Usual yield range, bu/ac, for plausibility warnings only. */
  usualYieldBushelsPerAcre: { low: number; high: number };
  /** Typical full (1×) seeding rate, lb/ac. */
  typicalReferenceRatePoundsPerAcre: number;
};

// Bushel weights: USDA, via Ohio State AGF-503 and the Missouri G4020 table [OSU-503; UNC-MO].
// Standard moisture: wheat 13.5, barley 14.5, oats 14 % [UW-R].
// Seed size: wheat 30–45 g [AWB]; rye 33 g [NDSU-R]; oats 12,000–17,000 seeds/lb [ISU-O]
// → 27–38 g; barley six-row 13,000–14,000 and two-row 9,400–10,000 seeds/lb [NDSU-B01]
// → 32–35 g and 45–48 g. No extension TKW table exists (TRADE_FACTS §8); values are mid-range.
// Yield ranges are plausibility bounds chosen for warnings, not published figures.
export const CROPS: Readonly<Record<CropKey, Crop>> = {
  wheat: {
    name: 'Winter wheat',
    bushelPounds: 60,
    standardMoisturePercent: 13.5,
    typicalThousandKernelWeightGrams: 38,
    usualYieldBushelsPerAcre: { low: 20, high: 130 },
    // 1.3–1.5 M plants/ac [PSU-AG]; ~1.6 M seeds/ac × 38 g ≈ 134 lb/ac; 90–120 is common.
    typicalReferenceRatePoundsPerAcre: 120,
  },
  springWheat: {
    name: 'Spring wheat',
    bushelPounds: 60,
    standardMoisturePercent: 13.5,
    typicalThousandKernelWeightGrams: 33,
    usualYieldBushelsPerAcre: { low: 20, high: 100 },
    // 30–32 plants/ft² [UMN-FP] ÷ 0.85 survival × 43,560 × 33 g ÷ 453,592 ≈ 110 lb/ac.
    typicalReferenceRatePoundsPerAcre: 110,
  },
  oats: {
    name: 'Oats',
    bushelPounds: 32,
    standardMoisturePercent: 14,
    typicalThousandKernelWeightGrams: 32,
    usualYieldBushelsPerAcre: { low: 30, high: 180 },
    // 1.0–1.3 M plants/ac [ISU-O] ÷ 0.85 × 32 g ÷ 453.6 g/lb / 1000 ≈ 95 lb/ac.
    typicalReferenceRatePoundsPerAcre: 95,
  },
  hullessOats: {
    name: 'Hulless (naked) oats',
    // Assumption: traded on the oat bushel of 32 lb; hulless grain is denser, so buyers may
    // quote test weight separately.
    bushelPounds: 32,
    // Assumption: no published reporting moisture for hulless oats; the oat standard (14 %) is used.
    standardMoisturePercent: 14,
    // Assumption: hulless-oat seed size is not sourced (TRADE_FACTS §8); ~25 g without the hull.
    typicalThousandKernelWeightGrams: 25,
    usualYieldBushelsPerAcre: { low: 20, high: 120 },
    // 400 seeds/m² [BODLE] × 25 g = 100 kg/ha ≈ 89 lb/ac.
    typicalReferenceRatePoundsPerAcre: 90,
  },
  barley: {
    name: 'Barley',
    bushelPounds: 48,
    standardMoisturePercent: 14.5,
    typicalThousandKernelWeightGrams: 40,
    usualYieldBushelsPerAcre: { low: 30, high: 150 },
    // Six-row 94–98 lb/ac, two-row about 130 lb/ac [NDSU-B01].
    typicalReferenceRatePoundsPerAcre: 100,
  },
  rye: {
    name: 'Winter rye',
    bushelPounds: 56,
    // Assumption: rye has no reporting standard; "14 % or lower is dry" for storage [AB-RYE].
    standardMoisturePercent: 14,
    typicalThousandKernelWeightGrams: 33,
    usualYieldBushelsPerAcre: { low: 15, high: 100 },
    // 1 M plants/ac, about 56 lb/ac [NDSU-R].
    typicalReferenceRatePoundsPerAcre: 56,
  },
};

/**
 * kg/ha equal to 1 bu/ac of a crop: bushel weight (lb) × 0.45359237 kg/lb × 2.47105 ac/ha.
 * Wheat 67.25, rye 62.77, barley 53.80, oats 35.87 [NDSU-MC].
 *
 * @param crop - crop key
 * @returns the factor
 * @throws Error for an unknown crop
 * @example kilogramsPerHectarePerBushelPerAcre('wheat') // 67.25
 */
export function kilogramsPerHectarePerBushelPerAcre(crop: CropKey): number {
  const entry = CROPS[crop];
  if (!entry) throw new Error(`kilogramsPerHectarePerBushelPerAcre: unknown crop "${crop}"`);
  return ((entry.bushelPounds * GRAMS_PER_POUND) / 1000) * ACRES_PER_HECTARE;
}
