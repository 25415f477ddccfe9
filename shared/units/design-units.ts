// The units a trial design is typed in, by the trial's unit system: the design is stored in inches,
// feet, pounds and bushels, and a metric trial shows and takes centimetres, metres and kilograms.
import type { RateUnit, UnitSystem } from '../schemas/trial';
import { GRAMS_PER_POUND, METRES_PER_FOOT } from './constants';

/** Centimetres in one inch, exact by definition (international yard and pound, 1959). */
export const CENTIMETRES_PER_INCH = 2.54;
/** Litres in one US (Winchester) bushel of 2,150.42 in³, exact from the inch. */
export const LITRES_PER_US_BUSHEL = 2150.42 * (CENTIMETRES_PER_INCH ** 3 / 1000);

/** One typed quantity: the unit shown, and how a shown value maps to the stored one and back. */
export interface UnitConversion {
  unit: string;
  toStored: (shown: number) => number;
  fromStored: (stored: number) => number;
}

const same = (unit: string): UnitConversion => ({
  unit,
  toStored: (v) => v,
  fromStored: (v) => v,
});

const scaled = (unit: string, storedPerShown: number): UnitConversion => ({
  unit,
  toStored: (v) => v * storedPerShown,
  fromStored: (v) => v / storedPerShown,
});

export interface DesignUnits {
  system: UnitSystem;
  /** Stored as inches. */
  rowSpacing: UnitConversion;
  /** Stored as feet. */
  stripLength: UnitConversion;
  /** Plants, heads or seeds per unit area, stored per ft². */
  perArea: UnitConversion;
  /** Seeds in a weight of the seed lot, stored as seeds per lb. */
  seedCount: UnitConversion;
  /** Seed price, stored as $ per lb. */
  seedPrice: UnitConversion;
  /** A custom crop's bushel (test) weight, stored as lb per bushel. */
  bushelWeight: UnitConversion;
  /** The rate unit a new design starts with. */
  defaultRateUnit: RateUnit;
  /** The weight unit growers weigh grain in. */
  grainWeightUnit: 'lb' | 'kg';
}

/**
 * The design's input units for a unit system.
 *
 * @param system - the trial's unit system
 * @returns conversions between what is typed and what is stored
 * @example designUnits('metric').rowSpacing.toStored(20) // 7.874… (inches)
 */
export function designUnits(system: UnitSystem): DesignUnits {
  if (system === 'imperial') {
    return {
      system,
      rowSpacing: same('in'),
      stripLength: same('ft'),
      perArea: same('ft²'),
      seedCount: same('seeds/lb'),
      seedPrice: same('$/lb'),
      bushelWeight: same('lb/bu'),
      defaultRateUnit: 'lb/acre',
      grainWeightUnit: 'lb',
    };
  }
  const kilogramsPerPound = GRAMS_PER_POUND / 1000;
  return {
    system,
    rowSpacing: scaled('cm', 1 / CENTIMETRES_PER_INCH),
    stripLength: scaled('m', 1 / METRES_PER_FOOT),
    // A count per m² is a count per (1 / 0.3048²) ft², so per ft² = per m² × 0.3048².
    perArea: scaled('m²', METRES_PER_FOOT * METRES_PER_FOOT),
    // Seeds per kg × kg per lb = seeds per lb.
    seedCount: scaled('seeds/kg', kilogramsPerPound),
    // $ per kg × kg per lb = $ per lb.
    seedPrice: scaled('$/kg', kilogramsPerPound),
    // kg/hL → lb/bu: (kg ÷ kg per lb) per (hL ÷ hL per bushel).
    bushelWeight: scaled('kg/hL', LITRES_PER_US_BUSHEL / 100 / kilogramsPerPound),
    defaultRateUnit: 'kg/ha',
    grainWeightUnit: 'kg',
  };
}

/**
 * Grain price per bushel (stored) against the price a metric grower quotes, per tonne; needs the
 * crop's bushel weight because a bushel is a volume.
 *
 * @param system - the trial's unit system
 * @param bushelPounds - the crop's bushel weight in lb (60 for wheat)
 */
export function grainPriceUnit(system: UnitSystem, bushelPounds: number | null): UnitConversion {
  if (system === 'imperial' || !bushelPounds) return same('$/bu');
  const tonnesPerBushel = (bushelPounds * GRAMS_PER_POUND) / 1_000_000;
  return scaled('$/t', tonnesPerBushel);
}
