// How a report shows its stored imperial values in the trial's unit system: counts per ft² or
// per m², seed price per lb or per kg, grain price per bushel or per tonne. The web pages and the
// PDF both use it, so they never disagree.
import { formatMoney } from '../reports/format-numbers';
import type { ReportUnits } from '../schemas/report';
import type { UnitSystem } from '../schemas/trial';
import { CROPS, type CropKey } from './crops';
import { designUnits, grainPriceUnit, type UnitConversion } from './design-units';

/** Yield units only a metric report gives: t/ha, and kg/ha in reports published before t/ha. */
const METRIC_YIELD_UNITS: readonly string[] = ['t/ha', 'kg/ha'];

export interface ReportDisplayUnits {
  system: UnitSystem;
  /** The land area money and yield are given per, in words. */
  landArea: 'acre' | 'hectare';
  /** Plants or heads per area: stored per ft², shown per m² on a metric trial. */
  perArea: UnitConversion;
  /** Seed price: stored (and sent to the API) as $ per lb, shown per kg on a metric trial. */
  seedPrice: UnitConversion;
  /** Grain price: stored (and sent to the API) as $ per bushel, shown per tonne on a metric trial. */
  grainPrice: UnitConversion;
}

/**
 * The display units of a report, from the units it carries. Reports published before the unit
 * system was part of the body are read by their yield unit: t/ha, or kg/ha as metric reports
 * gave it before, only on metric trials.
 *
 * @param units - the report's units
 * @param crop - the trial's crop key, for the bushel weight when the report lacks it
 * @returns conversions between the stored values and what the report shows
 * @example reportDisplayUnits({ yield: 't/ha', seed: 'kg/ha', money: '$/ha' }, 'wheat').grainPrice.unit // '$/t'
 */
export function reportDisplayUnits(units: ReportUnits, crop?: string | null): ReportDisplayUnits {
  const system: UnitSystem =
    units.system ?? (METRIC_YIELD_UNITS.includes(units.yield) ? 'metric' : 'imperial');
  const design = designUnits(system);
  const bushelPounds =
    units.bushelPounds ?? (crop && crop in CROPS ? CROPS[crop as CropKey].bushelPounds : null);
  return {
    system,
    landArea: system === 'metric' ? 'hectare' : 'acre',
    perArea: design.perArea,
    seedPrice: design.seedPrice,
    grainPrice: grainPriceUnit(system, bushelPounds),
  };
}

type StoredPrices = { seedPricePerLb: number | null; grainPricePerBu: number | null };

const shownPrice = (value: number | null, unit: UnitConversion) =>
  `${formatMoney(value === null ? null : unit.fromStored(value))}${unit.unit.replace('$', '')}`;

/**
 * The prices a report was worked out at, in words and the trial's units.
 *
 * @param prices - stored prices ($ per lb of seed, $ per bushel of grain)
 * @param display - the report's display units
 * @example pricesInWords({ seedPricePerLb: 0.5, grainPricePerBu: 9 }, reportDisplayUnits({ yield: 'bu/acre', seed: 'lb/acre', money: '$/acre' })) // 'seed $0.50/lb, grain $9.00/bu'
 */
export function pricesInWords(prices: StoredPrices, display: ReportDisplayUnits): string {
  return `seed ${shownPrice(prices.seedPricePerLb, display.seedPrice)}, grain ${shownPrice(prices.grainPricePerBu, display.grainPrice)}`;
}

/**
 * The prices as a findings sentence names them; per bushel and per lb when no units are given.
 *
 * @example pricePhrase({ seedPricePerLb: 0.5, grainPricePerBu: 9 }) // 'grain at $9.00/bu and seed at $0.50/lb'
 */
export function pricePhrase(prices: StoredPrices, display?: ReportDisplayUnits): string {
  const units =
    display ?? reportDisplayUnits({ yield: 'bu/acre', seed: 'lb/acre', money: '$/acre' });
  return `grain at ${shownPrice(prices.grainPricePerBu, units.grainPrice)} and seed at ${shownPrice(prices.seedPricePerLb, units.seedPrice)}`;
}
