// Builds a trial with sites, strips and observations straight in SQL, so report tests can
// publish and change data without touching the demo.
import type { DataSource } from 'typeorm';
import type { BuiltNetwork } from '../../helpers/app';

export interface StripSpec {
  block: number;
  /** Index into the trial's levels. */
  level: number;
  /**
   * Yield to build: bu/acre on an imperial trial, kg/ha (as weighed) on a metric one, whose report
   * gives it in t/ha; null = strip without yield.
   */
  yield: number | null;
  notes?: string;
}

export interface SiteSpec {
  fieldName: string;
  growerUserId?: string | null;
  soil?: string;
  previousCrop?: string;
  strips: StripSpec[];
}

export interface TrialSpec {
  name?: string;
  unitSystem?: 'imperial' | 'metric';
  crop?: string;
  customCrop?: Record<string, unknown> | null;
  referenceRate?: number;
  referenceUnit?: string;
  levels?: { multiplier: number; label: string }[];
  rowSpacingIn?: number;
  thousandKernelWeightG?: number;
  seedPricePerLb?: number;
  grainPricePerBu?: number;
  sites: SiteSpec[];
}

export interface BuiltTrial {
  trialId: string;
  siteIds: string[];
  levelIds: string[];
  stripIds: string[][];
}

/** Harvest area per strip: 100 ft² (imperial) or 10 m² (metric). */
const AREA = { imperial: 100, metric: 10 };
const BUSHEL_LB: Record<string, number> = {
  wheat: 60,
  springWheat: 60,
  oats: 32,
  hullessOats: 32,
  barley: 48,
  rye: 56,
};
const STANDARD_MOISTURE: Record<string, number> = {
  wheat: 13.5,
  springWheat: 13.5,
  oats: 14,
  hullessOats: 14,
  barley: 14.5,
  rye: 14,
};

/** Grain weight that gives `yieldValue` at the crop's standard moisture on the strip's area. */
export function grainWeightFor(
  spec: TrialSpec,
  yieldValue: number,
): { grainWeight: number; moisture: number; area: number } {
  const system = spec.unitSystem ?? 'imperial';
  const crop = spec.crop ?? 'wheat';
  const moisture =
    crop === 'custom'
      ? Number(spec.customCrop?.standardMoisturePct ?? 14)
      : STANDARD_MOISTURE[crop]!;
  if (system === 'metric')
    return { grainWeight: (yieldValue * AREA.metric) / 10_000, moisture, area: AREA.metric };
  const bushel =
    crop === 'custom' ? Number(spec.customCrop?.bushelWeightLb ?? 60) : BUSHEL_LB[crop]!;
  return {
    grainWeight: (yieldValue * bushel * AREA.imperial) / 43_560,
    moisture,
    area: AREA.imperial,
  };
}

export async function buildReportTrial(
  dataSource: DataSource,
  network: BuiltNetwork,
  spec: TrialSpec,
): Promise<BuiltTrial> {
  const levels = spec.levels ?? [
    { multiplier: 0.25, label: 'quarter' },
    { multiplier: 0.5, label: 'half' },
    { multiplier: 1, label: 'full' },
    { multiplier: 2, label: 'double' },
  ];
  const [trial] = await dataSource.query(
    `INSERT INTO trials (network_id, name, question, status, crop, custom_crop, season, unit_system, reference_rate, reference_unit,
        blocks_per_site, rows_per_strip, row_spacing_in, strip_length_ft, border_rows, thousand_kernel_weight_g,
        germination_pct, emergence_pct, seed_price_per_lb, grain_price_per_bu, created_by)
     VALUES ($1, $2, 'Can we sow less seed?', 'in-field', $3, $4, '2027', $5, $6, $7, 4, 4, $8, 50, 1, $9, 90, 85, $10, $11, $12)
     RETURNING id`,
    [
      network.networkId,
      spec.name ?? `Report test trial ${network.suffix}`,
      spec.crop ?? 'wheat',
      spec.customCrop ? JSON.stringify(spec.customCrop) : null,
      spec.unitSystem ?? 'imperial',
      spec.referenceRate ?? 100,
      spec.referenceUnit ?? 'lb/acre',
      spec.rowSpacingIn ?? 7.5,
      spec.thousandKernelWeightG ?? 38,
      spec.seedPricePerLb ?? 0.5,
      spec.grainPricePerBu ?? 8,
      network.userIds.coordinator,
    ],
  );
  const levelIds: string[] = [];
  for (const [i, level] of levels.entries()) {
    const [row] = await dataSource.query(
      'INSERT INTO rate_levels (trial_id, position, multiplier, label) VALUES ($1, $2, $3, $4) RETURNING id',
      [trial.id, i + 1, level.multiplier, level.label],
    );
    levelIds.push(row.id);
  }
  const siteIds: string[] = [];
  const stripIds: string[][] = [];
  for (const site of spec.sites) {
    const [siteRow] = await dataSource.query(
      `INSERT INTO sites (trial_id, grower_user_id, field_name, soil, previous_crop, randomization_seed, randomized_at, data_version)
       VALUES ($1, $2, $3, $4, $5, 'test', now(), 1) RETURNING id`,
      [
        trial.id,
        site.growerUserId ?? null,
        site.fieldName,
        site.soil ?? 'loam',
        site.previousCrop ?? 'peas',
      ],
    );
    siteIds.push(siteRow.id);
    const ids: string[] = [];
    const positions = new Map<number, number>();
    for (const strip of site.strips) {
      const position = (positions.get(strip.block) ?? 0) + 1;
      positions.set(strip.block, position);
      const [stripRow] = await dataSource.query(
        'INSERT INTO strips (site_id, block, position, rate_level_id) VALUES ($1, $2, $3, $4) RETURNING id',
        [siteRow.id, strip.block, position, levelIds[strip.level]],
      );
      ids.push(stripRow.id);
      if (strip.yield !== null) {
        const { grainWeight, moisture, area } = grainWeightFor(spec, strip.yield);
        await dataSource.query(
          `INSERT INTO observations (strip_id, stand_counts, stand_row_length, tiller_plants, tiller_count, head_counts, head_row_length,
             grain_weight, harvest_area, moisture_pct, notes)
           VALUES ($1, '[30, 32, 28]', 3, 10, 25, '[70, 66]', 3, $2, $3, $4, $5)`,
          [stripRow.id, grainWeight, area, moisture, strip.notes ?? ''],
        );
      }
    }
    stripIds.push(ids);
  }
  return { trialId: trial.id, siteIds, levelIds, stripIds };
}

/** A full RCBD site: yields[block][level]. */
export function rcbdStrips(yields: (number | null)[][]): StripSpec[] {
  return yields.flatMap((row, b) =>
    row.map((value, level) => ({ block: b + 1, level, yield: value })),
  );
}
