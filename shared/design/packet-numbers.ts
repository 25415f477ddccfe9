// The field packet's seeder-check and counting numbers in the trial's unit system: a metric
// trial calibrates per metre of row and a 1-m wheel turn and counts in 1 m of row (seeds/m²,
// kg/ha); an imperial trial per foot, a 3-ft wheel turn and 3 ft of row (seeds/ft², lb/acre).
import type { UnitSystem } from '../schemas/trial';
import { INCHES_PER_FOOT, METRES_PER_FOOT } from '../units/constants';
import { CENTIMETRES_PER_INCH } from '../units/design-units';
import { rateTable, type RateTableDesign } from './rate-table';

/** The lengths and units a packet speaks in, and how stored (imperial) values convert. */
export interface PacketUnits {
  system: UnitSystem;
  /** Unit of a length along the row: strip length, counting stick, wheel circumference. */
  length: 'm' | 'ft';
  /** "metre" or "foot", for sentences. */
  lengthWord: 'metre' | 'foot';
  area: 'm²' | 'ft²';
  rate: 'kg/ha' | 'lb/acre';
  weight: 'kg' | 'lb';
  spacing: 'cm' | 'in';
  /** The counting stick laid along the row, in `length` (1 m or 3 ft). */
  countLength: number;
  /** The drive-wheel circumference the table assumes, in `length` (1 m or 3 ft). */
  wheelCircumference: number;
  /** A length stored in feet (strip length) → `length`. */
  fromFeet: (feet: number) => number;
  /** Seeds per foot of row → seeds per `length` of row. */
  perRowLength: (perFoot: number) => number;
  /** Row spacing stored in inches → `spacing`. */
  rowSpacing: (inches: number) => number;
}

/**
 * The packet's units for a unit system (1 ft = 0.3048 m and 1 in = 2.54 cm exactly).
 *
 * @param system - the trial's unit system
 * @example packetUnits('metric').perRowLength(10) // 32.8 seeds per metre of row
 */
export function packetUnits(system: UnitSystem): PacketUnits {
  if (system === 'metric') {
    return {
      system,
      length: 'm',
      lengthWord: 'metre',
      area: 'm²',
      rate: 'kg/ha',
      weight: 'kg',
      spacing: 'cm',
      countLength: 1,
      wheelCircumference: 1,
      fromFeet: (feet) => feet * METRES_PER_FOOT,
      perRowLength: (perFoot) => perFoot / METRES_PER_FOOT,
      rowSpacing: (inches) => inches * CENTIMETRES_PER_INCH,
    };
  }
  return {
    system,
    length: 'ft',
    lengthWord: 'foot',
    area: 'ft²',
    rate: 'lb/acre',
    weight: 'lb',
    spacing: 'in',
    countLength: 3,
    wheelCircumference: 3,
    fromFeet: (feet) => feet,
    perRowLength: (perFoot) => perFoot,
    rowSpacing: (inches) => inches,
  };
}

export interface CalibrationRow {
  label: string;
  multiplier: number;
  /** The rate in kg/ha or lb/acre. */
  rate: number;
  /** Seeds per m² or ft². */
  seedsPerArea: number;
  /** Seeds per metre or foot of row. */
  seedsPerRowLength: number;
  /** Seeds one row outlet drops per turn of the assumed wheel (no wheel slip). */
  seedsPerTurn: number;
  seedsPerTenTurns: number;
}

/**
 * The seeder-check table: every rate level in the trial's units, with the seeds a row outlet
 * should drop per turn of a 1-m (metric) or 3-ft (imperial) drive wheel. Empty while the design
 * lacks a value the seed amounts need.
 *
 * @param design - the trial design (stored in imperial units)
 * @param system - the trial's unit system
 */
export function calibrationRows(design: RateTableDesign, system: UnitSystem): CalibrationRow[] {
  const units = packetUnits(system);
  const metric = system === 'metric';
  return rateTable(design).map((row) => {
    const seedsPerRowLength = units.perRowLength(row.seedsPerFootOfRow);
    const seedsPerTurn = seedsPerRowLength * units.wheelCircumference;
    return {
      label: row.label,
      multiplier: row.multiplier,
      rate: metric ? row.kilogramsPerHectare : row.poundsPerAcre,
      seedsPerArea: metric ? row.seedsPerSquareMetre : row.seedsPerSquareFoot,
      seedsPerRowLength,
      seedsPerTurn,
      seedsPerTenTurns: seedsPerTurn * 10,
    };
  });
}

export interface CountingRow {
  label: string;
  multiplier: number;
  /** Seeds sown along the counting stick (1 m or 3 ft of row). */
  seedsInCount: number;
  /** Seeds × germination × expected emergence along the stick. */
  expectedPlantsInCount: number;
}

export interface CountingNumbers {
  units: PacketUnits;
  /** Plants per m² (or ft²) that one plant counted along the stick stands for; null without a row spacing. */
  areaPerPlantCounted: number | null;
  /** What a stand count should come to at each rate. */
  rows: CountingRow[];
}

/**
 * What a stand count along the stick means at this trial's row spacing, and what it should
 * come to at each rate: plants/area = count ÷ (stick length × row spacing).
 *
 * @param design - the trial design (stored in imperial units)
 * @param system - the trial's unit system
 */
export function countingNumbers(design: RateTableDesign, system: UnitSystem): CountingNumbers {
  const units = packetUnits(system);
  const spacingInches = design.rowSpacingIn ?? null;
  // Row spacing in the unit of length: cm → m, in → ft.
  const spacing =
    spacingInches && spacingInches > 0
      ? system === 'metric'
        ? units.rowSpacing(spacingInches) / 100
        : spacingInches / INCHES_PER_FOOT
      : null;
  const survival = ((design.germinationPct ?? 100) / 100) * ((design.emergencePct ?? 100) / 100);
  return {
    units,
    areaPerPlantCounted: spacing === null ? null : 1 / (units.countLength * spacing),
    rows: rateTable(design).map((row) => {
      const seedsInCount = units.perRowLength(row.seedsPerFootOfRow) * units.countLength;
      return {
        label: row.label,
        multiplier: row.multiplier,
        seedsInCount,
        expectedPlantsInCount: seedsInCount * survival,
      };
    }),
  };
}
