// The trial's strips as CSV: raw observations and derived values, one strip per row, with
// text cells defused so a spreadsheet never runs them as formulas. Every header names its unit,
// in the trial's unit system.
import {
  ACRES_PER_HECTARE,
  KG_PER_HA_PER_LB_PER_ACRE,
  KILOGRAMS_PER_TONNE,
  SQUARE_FEET_PER_SQUARE_METRE,
} from '../../shared/units/constants';
import { plotNumber } from '../../shared/units/plot-number';
import type { DerivedValues } from '../../shared/schemas/observation';
import type { DerivedStrip, SiteRow, TrialFacts } from './reports.presenter';

/**
 * Quotes a CSV cell when needed (RFC 4180) and, for text, prefixes a leading = + - @ (or tab
 * and carriage return) with an apostrophe: OWASP's advice against CSV injection. Numbers
 * Sheaf computed are written as they are, so negative returns stay numeric.
 */
export function csvCell(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  let text = value;
  if (/^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return /[",\n\r]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

type Derived = (d: DerivedValues) => number | null;
const times =
  (key: keyof DerivedValues, factor: number): Derived =>
  (d) =>
    d[key] === null ? null : d[key] * factor;
const plain =
  (key: keyof DerivedValues): Derived =>
  (d) =>
    d[key];

/** Derived columns with the unit in each header: an imperial trial's (with kg/ha and m² beside). */
const IMPERIAL_DERIVED: [string, Derived][] = (
  [
    'targetSeedsPerSquareFoot',
    'seedPoundsPerAcre',
    'plantsPerSquareFoot',
    'plantsPerSquareMetre',
    'establishmentPercent',
    'tillersPerPlant',
    'headsPerSquareFoot',
    'headsPerSquareMetre',
    'headsPerPlant',
    'harvestedAreaSquareFeet',
    'yieldBushelsPerAcre',
    'yieldKilogramsPerHectare',
    'seedReturn',
    'returnOverSeedCostPerAcre',
  ] as const
).map((key) => [key.replace(/[A-Z]/g, (m) => `_${m.toLowerCase()}`), plain(key)]);

/** A metric trial's derived columns: per m², seed in kg/ha, yield in t/ha, m² and $ per hectare only. */
const METRIC_DERIVED: [string, Derived][] = [
  [
    'target_seeds_per_square_metre',
    times('targetSeedsPerSquareFoot', SQUARE_FEET_PER_SQUARE_METRE),
  ],
  ['seed_kilograms_per_hectare', times('seedPoundsPerAcre', KG_PER_HA_PER_LB_PER_ACRE)],
  ['plants_per_square_metre', plain('plantsPerSquareMetre')],
  ['establishment_percent', plain('establishmentPercent')],
  ['tillers_per_plant', plain('tillersPerPlant')],
  ['heads_per_square_metre', plain('headsPerSquareMetre')],
  ['heads_per_plant', plain('headsPerPlant')],
  [
    'harvested_area_square_metres',
    times('harvestedAreaSquareFeet', 1 / SQUARE_FEET_PER_SQUARE_METRE),
  ],
  ['yield_tonnes_per_hectare', times('yieldKilogramsPerHectare', 1 / KILOGRAMS_PER_TONNE)],
  ['seed_return', plain('seedReturn')],
  ['return_over_seed_cost_per_hectare', times('returnOverSeedCostPerAcre', ACRES_PER_HECTARE)],
];

const round = (value: number | null, digits = 4) =>
  value === null ? null : Number(value.toFixed(digits));

export function stripsCsv(
  trial: TrialFacts,
  sites: readonly SiteRow[],
  strips: readonly DerivedStrip[],
): string {
  const siteById = new Map(sites.map((s) => [s.id, s]));
  const lengthUnit = trial.unitSystem === 'metric' ? 'm' : 'ft';
  const weightUnit = trial.unitSystem === 'metric' ? 'kg' : 'lb';
  const derivedColumns = trial.unitSystem === 'metric' ? METRIC_DERIVED : IMPERIAL_DERIVED;
  const header = [
    'trial',
    'site_id',
    'field',
    'grower',
    'soil',
    'previous_crop',
    'block',
    'position',
    'plot',
    'rate_multiplier',
    'rate_label',
    'seeds_sown',
    'stand_counts',
    `stand_row_length_${lengthUnit}`,
    'tiller_plants',
    'tiller_count',
    'head_counts',
    `head_row_length_${lengthUnit}`,
    `grain_weight_${weightUnit}`,
    'harvest_rows',
    `harvest_length_${lengthUnit}`,
    `harvest_area_${lengthUnit}2`,
    'moisture_pct',
    trial.unitSystem === 'metric' ? 'test_weight_kg_hl' : 'test_weight_lb_bu',
    'sowing_date',
    'emergence_date',
    'heading_date',
    'harvest_date',
    'notes',
    ...derivedColumns.map(([name]) => name),
  ];
  const lines = [header.map(csvCell).join(',')];
  const ordered = [...strips].sort((a, b) => {
    const siteA = siteById.get(a.strip.siteId)?.fieldName ?? '';
    const siteB = siteById.get(b.strip.siteId)?.fieldName ?? '';
    return (
      siteA.localeCompare(siteB) ||
      a.strip.block - b.strip.block ||
      a.strip.position - b.strip.position
    );
  });
  for (const s of ordered) {
    const site = siteById.get(s.strip.siteId);
    const o = s.strip.observation;
    const cells: (string | number | null)[] = [
      trial.name,
      s.strip.siteId,
      site?.fieldName ?? '',
      site?.growerName ?? '',
      site?.soil ?? '',
      site?.previousCrop ?? '',
      s.strip.block,
      s.strip.position,
      plotNumber(s.strip.block, s.strip.position),
      Number(s.rate),
      s.label,
      o?.seedsSown ?? null,
      o ? o.standCounts.join(';') : '',
      o?.standRowLength ?? null,
      o?.tillerPlants ?? null,
      o?.tillerCount ?? null,
      o ? o.headCounts.join(';') : '',
      o?.headRowLength ?? null,
      o?.grainWeight ?? null,
      o?.harvestRows ?? null,
      o?.harvestLength ?? null,
      o?.harvestArea ?? null,
      o?.moisturePct ?? null,
      o?.testWeight ?? null,
      o?.sowingDate ?? '',
      o?.emergenceDate ?? '',
      o?.headingDate ?? '',
      o?.harvestDate ?? '',
      o?.notes ?? '',
      ...derivedColumns.map(([, value]) => round(s.derived ? value(s.derived) : null)),
    ];
    lines.push(cells.map(csvCell).join(','));
  }
  return `${lines.join('\r\n')}\r\n`;
}
