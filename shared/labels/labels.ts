// The words Sheaf shows for crops, rate units and rate levels, in one place for the web app, the
// printed packet and report, and the e-mails.
import type { CalcUnit } from '../schemas/calc';
import type { CropKey, RateUnit } from '../schemas/trial';
import { CROPS } from '../units/crops';
import { groupedDecimal, onFirstUse } from './decimal-text';

/** Crop names as a coordinator chooses them; the six built-in crops use the crop table's name. */
export const CROP_LABELS: Readonly<Record<CropKey, string>> = {
  wheat: CROPS.wheat.name,
  springWheat: CROPS.springWheat.name,
  oats: CROPS.oats.name,
  hullessOats: CROPS.hullessOats.name,
  barley: CROPS.barley.name,
  rye: CROPS.rye.name,
  custom: 'Another crop (enter its values)',
};

/** A crop's name for a list or heading ("Other crop" for a custom crop without its own name). */
export function cropLabel(crop: CropKey | string | null | undefined): string {
  if (!crop) return 'Crop not chosen';
  if (crop === 'custom') return 'Other crop';
  return CROP_LABELS[crop as CropKey] ?? crop;
}

/** Rate units and target-stand units in words. */
export const RATE_UNIT_LABELS: Readonly<Record<CalcUnit, string>> = {
  'lb/acre': 'lb per acre',
  'kg/ha': 'kg per hectare',
  'seeds/ft2': 'seeds per ft²',
  'seeds/m2': 'seeds per m²',
  'seeds/ft-row': 'seeds per foot of row',
  'plants/ft2': 'target plants per ft²',
  'plants/m2': 'target plants per m²',
  'plants/acre': 'target plants per acre',
};

export function rateUnitLabel(unit: RateUnit | CalcUnit | null | undefined): string {
  return RATE_UNIT_LABELS[unit ?? 'lb/acre'];
}

const multiplierFormat = onFirstUse(
  () => new Intl.NumberFormat('en', { maximumFractionDigits: 3 }),
);

/** A rate level as the map and tables show it: "half (0.5 × full rate)". */
export function rateLevelLabel(level: { label: string; multiplier: number }): string {
  return `${level.label} (${multiplierFormat().format(level.multiplier)} × full rate)`;
}

/** The short form for tight places (map cells, chart axes): "half · 0.5×". */
export function rateLevelShort(level: { label: string; multiplier: number }): string {
  return `${level.label} · ${multiplierFormat().format(level.multiplier)}×`;
}

/**
 * Seed to weigh for a strip, the same on the map, the weighing table and the calculator:
 * one decimal (a kitchen scale reads 0.1 g), so the map and the table never disagree.
 */
export function seedGrams(grams: number | null | undefined): string {
  return grams === null || grams === undefined || !(grams > 0)
    ? '—'
    : `${groupedDecimal(grams, 1)} g`;
}

const moneyFormat = onFirstUse(
  () =>
    new Intl.NumberFormat('en', {
      style: 'currency',
      currency: 'USD',
      minimumFractionDigits: 2,
      maximumFractionDigits: 2,
    }),
);

/** A price per unit with cents: "$0.90/lb". */
export function pricePer(value: number | null | undefined, unit: string): string {
  return value === null || value === undefined ? '—' : `${moneyFormat().format(value)}/${unit}`;
}

/** "1 check", "3 checks", "12.5 turns". */
export function countOf(count: number, one: string, many = `${one}s`): string {
  // Whole counts without the locale data (decimal-text.ts); a fraction keeps up to 3 decimals.
  const shown = Number.isInteger(count) ? groupedDecimal(count, 0) : count.toLocaleString('en');
  return `${shown} ${count === 1 ? one : many}`;
}
