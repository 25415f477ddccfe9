// The trial's strips as CSV: raw observations and derived values, one strip per row, with
// text cells defused so a spreadsheet never runs them as formulas.
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

const DERIVED_COLUMNS: (keyof DerivedValues)[] = [
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
    'test_weight',
    'sowing_date',
    'emergence_date',
    'heading_date',
    'harvest_date',
    'notes',
    ...DERIVED_COLUMNS.map((c) => c.replace(/[A-Z]/g, (m) => `_${m.toLowerCase()}`)),
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
      ...DERIVED_COLUMNS.map((c) => round(s.derived?.[c] ?? null)),
    ];
    lines.push(cells.map(csvCell).join(','));
  }
  return `${lines.join('\r\n')}\r\n`;
}
