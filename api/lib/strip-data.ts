// Reading and writing strip observations inside a transaction, shared by the strip form, the
// CSV import and site data: site context, row mapping, the publish lock and data_version bumps.
import type { EntityManager } from 'typeorm';
import { EMPTY_OBSERVATION, type ObservationValues } from '../../shared/schemas/observation';
import type { SiteDates } from '../../shared/schemas/strip';
import type { CropKey, CustomCrop, RateUnit, UnitSystem } from '../../shared/schemas/trial';
import { preparedQuery } from '../../db/prepared';
import { AUDIT_INSERT } from '../audit/audit.service';
import { Locked, NotFound } from '../errors';

export interface SiteRecord extends SiteDates {
  siteId: string;
  trialId: string;
  networkId: string;
  trialName: string;
  fieldName: string;
  notes: string;
  growerUserId: string | null;
  growerName: string | null;
  growerEmail: string | null;
  unitSystem: UnitSystem;
  crop: CropKey | null;
  customCrop: CustomCrop | null;
  blocksPerSite: number | null;
  rowsPerStrip: number | null;
  rowSpacingIn: number | null;
  stripLengthFt: number | null;
  thousandKernelWeightG: number | null;
  referenceRate: number | null;
  referenceUnit: RateUnit | null;
  seedPricePerLb: number | null;
  grainPricePerBu: number | null;
  publishedAt: string | null;
  dataVersion: number;
  rateLevels: { id: string; multiplier: number; label: string }[];
}

export interface StripRecord {
  stripId: string;
  siteId: string;
  block: number;
  position: number;
  rateLevelId: string;
  rate: number;
  label: string;
  version: number;
  values: ObservationValues;
  /** False when the strip has no observations row yet. */
  hasObservation: boolean;
  updatedAt: string | null;
}

const num = (value: unknown): number | null =>
  value === null || value === undefined ? null : Number(value);
const iso = (value: unknown): string | null =>
  value instanceof Date
    ? value.toISOString()
    : value === null || value === undefined
      ? null
      : String(value);

/** Which site: by its id, or by the id of one of its strips (saves a lookup on strip routes). */
export type SiteKey = string | { stripId: string };
const siteIdSql = (key: SiteKey) =>
  typeof key === 'string' ? '$1' : '(SELECT site_id FROM strips WHERE id = $1)';
const siteKeyParam = (key: SiteKey) => (typeof key === 'string' ? key : key.stripId);

const SITE_SELECT = `
  SELECT s.id, s.trial_id, t.network_id, t.name AS trial_name, s.field_name, s.notes, s.grower_user_id,
         u.name AS grower_name, COALESCE(u.email, s.grower_email) AS grower_email,
         t.unit_system, t.crop, t.custom_crop, t.blocks_per_site, t.rows_per_strip, t.row_spacing_in,
         t.strip_length_ft, t.thousand_kernel_weight_g, t.reference_rate, t.reference_unit,
         t.seed_price_per_lb, t.grain_price_per_bu, s.published_at, s.data_version,
         s.sowing_date::text AS sowing_date, s.emergence_date::text AS emergence_date,
         s.heading_date::text AS heading_date, s.harvest_date::text AS harvest_date,
         (SELECT coalesce(json_agg(json_build_object('id', r.id, 'multiplier', r.multiplier, 'label', r.label) ORDER BY r.multiplier), '[]')
            FROM rate_levels r WHERE r.trial_id = t.id) AS levels
    FROM sites s JOIN trials t ON t.id = s.trial_id LEFT JOIN users u ON u.id = s.grower_user_id`;

/** The site with its trial's layout and rate levels, in one query; `lock` takes the row lock writers need. */
export async function loadSite(
  manager: EntityManager,
  key: SiteKey,
  options: { lock?: boolean } = {},
): Promise<SiteRecord> {
  const rows = await preparedQuery(
    manager,
    `${SITE_SELECT} WHERE s.id = ${siteIdSql(key)}${options.lock ? ' FOR UPDATE OF s' : ''}`,
    [siteKeyParam(key)],
  );
  if (!rows[0]) throw new NotFound(typeof key === 'string' ? 'Site' : 'Strip');
  return toSiteRecord(rows[0]);
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function toSiteRecord(row: any): SiteRecord {
  const levels: { id: string; multiplier: string | number; label: string }[] = row.levels;
  return {
    siteId: row.id,
    trialId: row.trial_id,
    networkId: row.network_id,
    trialName: row.trial_name,
    fieldName: row.field_name,
    notes: row.notes,
    growerUserId: row.grower_user_id,
    growerName: row.grower_name,
    growerEmail: row.grower_email,
    unitSystem: row.unit_system,
    crop: row.crop,
    customCrop: row.custom_crop,
    blocksPerSite: num(row.blocks_per_site),
    rowsPerStrip: num(row.rows_per_strip),
    rowSpacingIn: num(row.row_spacing_in),
    stripLengthFt: num(row.strip_length_ft),
    thousandKernelWeightG: num(row.thousand_kernel_weight_g),
    referenceRate: num(row.reference_rate),
    referenceUnit: row.reference_unit,
    seedPricePerLb: num(row.seed_price_per_lb),
    grainPricePerBu: num(row.grain_price_per_bu),
    publishedAt: iso(row.published_at),
    dataVersion: Number(row.data_version),
    sowingDate: row.sowing_date,
    emergenceDate: row.emergence_date,
    headingDate: row.heading_date,
    harvestDate: row.harvest_date,
    rateLevels: levels.map((l) => ({ id: l.id, multiplier: Number(l.multiplier), label: l.label })),
  };
}

/** The answer to a data change on a site whose report is published. */
export const publishedSiteLocked = () =>
  new Locked(
    'The report for this site is published, so its data is read-only. Ask the coordinator to unpublish it to make changes.',
  );

/** Locks the site row for a data change and refuses when its report is published. */
export async function lockSiteForChange(
  manager: EntityManager,
  siteId: string,
): Promise<SiteRecord> {
  const site = await loadSite(manager, siteId, { lock: true });
  if (site.publishedAt) throw publishedSiteLocked();
  return site;
}

/** Reports compare data_version with their snapshot: bump it on every change to site data. */
export async function bumpDataVersion(manager: EntityManager, siteId: string): Promise<number> {
  // Wrapped in a CTE so the driver answers with rows (a bare UPDATE answers [rows, count]).
  const [row] = await manager.query(
    'WITH bumped AS (UPDATE sites SET data_version = data_version + 1, updated_at = now() WHERE id = $1 RETURNING data_version) SELECT data_version FROM bumped',
    [siteId],
  );
  return Number(row.data_version);
}

const STRIP_SELECT = `
  SELECT st.id, st.site_id, st.block, st.position, st.rate_level_id, st.version, rl.multiplier, rl.label,
         o.strip_id AS obs_id, o.seeds_sown, o.stand_counts, o.stand_row_length, o.tiller_plants, o.tiller_count,
         o.head_counts, o.head_row_length, o.grain_weight, o.harvest_rows, o.harvest_length, o.harvest_area,
         o.moisture_pct, o.test_weight, o.sowing_date::text AS sowing_date, o.emergence_date::text AS emergence_date,
         o.heading_date::text AS heading_date, o.harvest_date::text AS harvest_date, o.notes, o.updated_at
    FROM strips st JOIN rate_levels rl ON rl.id = st.rate_level_id
    LEFT JOIN observations o ON o.strip_id = st.id`;

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function toStripRecord(row: any): StripRecord {
  const values: ObservationValues = row.obs_id
    ? {
        seedsSown: num(row.seeds_sown),
        standCounts: (row.stand_counts ?? []).map(Number),
        standRowLength: num(row.stand_row_length),
        tillerPlants: num(row.tiller_plants),
        tillerCount: num(row.tiller_count),
        headCounts: (row.head_counts ?? []).map(Number),
        headRowLength: num(row.head_row_length),
        grainWeight: num(row.grain_weight),
        harvestRows: num(row.harvest_rows),
        harvestLength: num(row.harvest_length),
        harvestArea: num(row.harvest_area),
        moisturePct: num(row.moisture_pct),
        testWeight: num(row.test_weight),
        sowingDate: row.sowing_date,
        emergenceDate: row.emergence_date,
        headingDate: row.heading_date,
        harvestDate: row.harvest_date,
        notes: row.notes ?? '',
      }
    : { ...EMPTY_OBSERVATION, standCounts: [], headCounts: [] };
  return {
    stripId: row.id,
    siteId: row.site_id,
    block: Number(row.block),
    position: Number(row.position),
    rateLevelId: row.rate_level_id,
    rate: Number(row.multiplier),
    label: row.label,
    version: Number(row.version),
    values,
    hasObservation: Boolean(row.obs_id),
    updatedAt: iso(row.updated_at),
  };
}

export async function loadSiteStrips(
  manager: EntityManager,
  key: SiteKey,
  options: { lock?: boolean } = {},
): Promise<StripRecord[]> {
  const rows = await preparedQuery(
    manager,
    `${STRIP_SELECT} WHERE st.site_id = ${siteIdSql(key)} ORDER BY st.block, st.position${options.lock ? ' FOR UPDATE OF st' : ''}`,
    [siteKeyParam(key)],
  );
  return rows.map(toStripRecord);
}

export async function loadStrip(
  manager: EntityManager,
  stripId: string,
  options: { lock?: boolean } = {},
): Promise<StripRecord> {
  const rows = await preparedQuery(
    manager,
    `${STRIP_SELECT} WHERE st.id = $1${options.lock ? ' FOR UPDATE OF st' : ''}`,
    [stripId],
  );
  if (!rows[0]) throw new NotFound('Strip');
  return toStripRecord(rows[0]);
}

const sameValue = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

/** The fields whose values differ, with their old and new values (for the audit trail). */
export function changedFields(
  before: ObservationValues,
  after: ObservationValues,
): { before: Record<string, unknown>; after: Record<string, unknown> } | null {
  const old: Record<string, unknown> = {};
  const now: Record<string, unknown> = {};
  for (const key of Object.keys(after) as (keyof ObservationValues)[]) {
    if (!sameValue(before[key], after[key])) {
      old[key] = before[key];
      now[key] = after[key];
    }
  }
  return Object.keys(now).length === 0 ? null : { before: old, after: now };
}

/** Whether every field of a partial update already holds the given value. */
export function patchAlreadyApplied(
  current: ObservationValues,
  patch: Partial<ObservationValues>,
): boolean {
  return (Object.keys(patch) as (keyof ObservationValues)[]).every((key) =>
    sameValue(current[key], patch[key]),
  );
}

const OBSERVATION_RECORD = `strip_id uuid, seeds_sown integer, stand_counts jsonb, stand_row_length numeric, tiller_plants integer,
  tiller_count integer, head_counts jsonb, head_row_length numeric, grain_weight numeric, harvest_rows integer,
  harvest_length numeric, harvest_area numeric, moisture_pct numeric, test_weight numeric, sowing_date date,
  emergence_date date, heading_date date, harvest_date date, notes text`;

const OBSERVATION_INSERT = `INSERT INTO observations (strip_id, seeds_sown, stand_counts, stand_row_length, tiller_plants, tiller_count,
    head_counts, head_row_length, grain_weight, harvest_rows, harvest_length, harvest_area, moisture_pct,
    test_weight, sowing_date, emergence_date, heading_date, harvest_date, notes, updated_by, updated_at)
  SELECT x.strip_id, x.seeds_sown, coalesce(x.stand_counts, '[]'), x.stand_row_length, x.tiller_plants, x.tiller_count,
         coalesce(x.head_counts, '[]'), x.head_row_length, x.grain_weight, x.harvest_rows, x.harvest_length, x.harvest_area,
         x.moisture_pct, x.test_weight, x.sowing_date, x.emergence_date, x.heading_date, x.harvest_date, coalesce(x.notes, '')`;

const OBSERVATION_ON_CONFLICT = `ON CONFLICT (strip_id) DO UPDATE SET
    seeds_sown = EXCLUDED.seeds_sown, stand_counts = EXCLUDED.stand_counts, stand_row_length = EXCLUDED.stand_row_length,
    tiller_plants = EXCLUDED.tiller_plants, tiller_count = EXCLUDED.tiller_count, head_counts = EXCLUDED.head_counts,
    head_row_length = EXCLUDED.head_row_length, grain_weight = EXCLUDED.grain_weight, harvest_rows = EXCLUDED.harvest_rows,
    harvest_length = EXCLUDED.harvest_length, harvest_area = EXCLUDED.harvest_area, moisture_pct = EXCLUDED.moisture_pct,
    test_weight = EXCLUDED.test_weight, sowing_date = EXCLUDED.sowing_date, emergence_date = EXCLUDED.emergence_date,
    heading_date = EXCLUDED.heading_date, harvest_date = EXCLUDED.harvest_date, notes = EXCLUDED.notes,
    updated_by = EXCLUDED.updated_by, updated_at = now()`;

/** Observation values as the rows jsonb_to_recordset(OBSERVATION_RECORD) reads. */
function observationRecords(rows: readonly { stripId: string; values: ObservationValues }[]) {
  return rows.map(({ stripId, values }) => ({
    strip_id: stripId,
    seeds_sown: values.seedsSown,
    stand_counts: values.standCounts,
    stand_row_length: values.standRowLength,
    tiller_plants: values.tillerPlants,
    tiller_count: values.tillerCount,
    head_counts: values.headCounts,
    head_row_length: values.headRowLength,
    grain_weight: values.grainWeight,
    harvest_rows: values.harvestRows,
    harvest_length: values.harvestLength,
    harvest_area: values.harvestArea,
    moisture_pct: values.moisturePct,
    test_weight: values.testWeight,
    sowing_date: values.sowingDate,
    emergence_date: values.emergenceDate,
    heading_date: values.headingDate,
    harvest_date: values.harvestDate,
    notes: values.notes,
  }));
}

/**
 * Inserts or replaces the observations of many strips in one statement per thousand (a CSV
 * import of 5,000 rows would otherwise make 5,000 round trips). Versions are the caller's.
 */
export async function writeObservationsInBulk(
  manager: EntityManager,
  rows: readonly { stripId: string; values: ObservationValues }[],
  actorUserId: string | null,
): Promise<void> {
  for (let start = 0; start < rows.length; start += 1000) {
    await manager.query(
      `${OBSERVATION_INSERT}, $2, now()
         FROM jsonb_to_recordset($1::jsonb) AS x(${OBSERVATION_RECORD})
       ${OBSERVATION_ON_CONFLICT}`,
      [JSON.stringify(observationRecords(rows.slice(start, start + 1000))), actorUserId],
    );
  }
}

/**
 * One strip's change as a single statement (so a single round trip, atomic on its own): lock the
 * site and refuse when its report is published, move the strip's version only when it is still
 * the one the change was made on, then write the observation, the audit event and the site's
 * data_version. PostgreSQL runs every WITH part once; each write waits for `bumped`.
 */
const STRIP_CHANGE = `
  WITH open_site AS (
    SELECT id FROM sites WHERE id = $1 AND published_at IS NULL FOR UPDATE
  ), bumped AS (
    UPDATE strips SET version = version + 1
     WHERE id = $2 AND site_id = $1 AND version = $3 AND EXISTS (SELECT 1 FROM open_site)
    RETURNING version
  ), written AS (
    ${OBSERVATION_INSERT}, $5::uuid, now()
      FROM jsonb_to_recordset($4::jsonb) AS x(${OBSERVATION_RECORD})
     WHERE EXISTS (SELECT 1 FROM bumped)
    ${OBSERVATION_ON_CONFLICT}
    RETURNING updated_at
  ), audited AS (
    ${AUDIT_INSERT}
    SELECT $5::uuid, 'strip', $2::uuid, $1::uuid, 'update', $6::jsonb, $7::jsonb WHERE EXISTS (SELECT 1 FROM bumped)
  ), versioned AS (
    UPDATE sites SET data_version = data_version + 1, updated_at = now()
     WHERE id = $1 AND EXISTS (SELECT 1 FROM bumped)
    RETURNING data_version
  )
  SELECT EXISTS (SELECT 1 FROM open_site) AS open, (SELECT version FROM bumped) AS version,
         (SELECT updated_at FROM written) AS updated_at, (SELECT data_version FROM versioned) AS data_version`;

export type StripChangeOutcome =
  { kind: 'saved'; version: number; updatedAt: string } | { kind: 'stale' } | { kind: 'published' };

/** Saves one strip's observation made on `version`, with its audit trail (see STRIP_CHANGE). */
export async function changeStrip(
  manager: EntityManager,
  change: {
    siteId: string;
    stripId: string;
    version: number;
    values: ObservationValues;
    actorUserId: string;
    before: Record<string, unknown>;
    after: Record<string, unknown>;
  },
): Promise<StripChangeOutcome> {
  const [row] = await preparedQuery<{
    open: boolean;
    version: string | null;
    updated_at: Date | null;
  }>(manager, STRIP_CHANGE, [
    change.siteId,
    change.stripId,
    change.version,
    JSON.stringify(observationRecords([{ stripId: change.stripId, values: change.values }])),
    change.actorUserId,
    JSON.stringify(change.before),
    JSON.stringify(change.after),
  ]);
  if (!row?.open) return { kind: 'published' };
  if (row.version === null) return { kind: 'stale' };
  return { kind: 'saved', version: Number(row.version), updatedAt: iso(row.updated_at)! };
}
