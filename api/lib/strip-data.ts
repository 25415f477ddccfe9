// Site and strip data for collection and reports, through TypeORM: the site with its trial's
// design, its strips with their observations, the publish lock and the data_version bump. The one
// mapping between the observations table and ObservationValues lives here.
import type { EntityManager } from 'typeorm';
import { Observation } from '../../db/entities/observation.entity';
import { Site } from '../../db/entities/site.entity';
import { Strip } from '../../db/entities/strip.entity';
import { EMPTY_OBSERVATION, type ObservationValues } from '../../shared/schemas/observation';
import type { SiteDates } from '../../shared/schemas/strip';
import type { CropKey, CustomCrop, RateUnit, UnitSystem } from '../../shared/schemas/trial';
import { recordAudit } from '../audit/audit.service';
import { Locked, NotFound } from '../errors';

export interface SiteRecord extends SiteDates {
  siteId: string;
  trialId: string;
  networkId: string;
  trialName: string;
  /** The trial's stage: a closed trial is read-only. */
  trialStatus: string;
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

/**
 * The site entity with its trial, the trial's rate levels (lowest first) and the grower; `lock`
 * also takes the site row's lock in the same query (writers wait on it).
 */
export async function findSiteWithDesign(
  manager: EntityManager,
  siteId: string,
  options: { lock?: boolean } = {},
): Promise<Site> {
  const query = manager
    .getRepository(Site)
    .createQueryBuilder('site')
    .innerJoinAndSelect('site.trial', 'trial')
    .leftJoinAndSelect('trial.rateLevels', 'level')
    // Only the grower's name and address: the account row also holds the password hash.
    .leftJoin('site.grower', 'grower')
    .addSelect(['grower.id', 'grower.name', 'grower.email'])
    .where('site.id = :siteId', { siteId })
    .orderBy('level.multiplier', 'ASC');
  if (options.lock) query.setLock('pessimistic_write', undefined, ['site']);
  const site = await query.getOne();
  if (!site) throw new NotFound('Site');
  return site;
}

export function toSiteRecord(site: Site): SiteRecord {
  const trial = site.trial!;
  return {
    siteId: site.id,
    trialId: site.trialId,
    networkId: trial.networkId,
    trialName: trial.name,
    trialStatus: trial.status,
    fieldName: site.fieldName,
    notes: site.notes,
    growerUserId: site.growerUserId,
    growerName: site.grower?.name ?? null,
    growerEmail: site.grower?.email ?? site.growerEmail,
    unitSystem: trial.unitSystem,
    crop: trial.crop,
    customCrop: trial.customCrop,
    blocksPerSite: trial.blocksPerSite,
    rowsPerStrip: trial.rowsPerStrip,
    rowSpacingIn: trial.rowSpacingIn,
    stripLengthFt: trial.stripLengthFt,
    thousandKernelWeightG: trial.thousandKernelWeightG,
    referenceRate: trial.referenceRate,
    referenceUnit: trial.referenceUnit,
    seedPricePerLb: trial.seedPricePerLb,
    grainPricePerBu: trial.grainPricePerBu,
    publishedAt: site.publishedAt?.toISOString() ?? null,
    dataVersion: site.dataVersion,
    sowingDate: site.sowingDate,
    emergenceDate: site.emergenceDate,
    headingDate: site.headingDate,
    harvestDate: site.harvestDate,
    rateLevels: (trial.rateLevels ?? []).map((l) => ({
      id: l.id,
      multiplier: l.multiplier,
      label: l.label,
    })),
  };
}

/** The site with its trial's layout and rate levels; `lock` takes the row lock writers need first. */
export async function loadSite(
  manager: EntityManager,
  siteId: string,
  options: { lock?: boolean } = {},
): Promise<SiteRecord> {
  return toSiteRecord(await findSiteWithDesign(manager, siteId, options));
}

/** The answer to a data change on a site whose report is published. */
export const publishedSiteLocked = () =>
  new Locked(
    'The report for this site is published, so its data is read-only. Ask the coordinator to unpublish it to make changes.',
  );

/** The answer to a data change on a site whose trial is closed. */
export const closedTrialLocked = () =>
  new Locked(
    'This trial is closed, so its data is read-only. Ask the coordinator to reopen it to make changes.',
  );

/** Refuses a data change on a published site or a closed trial. */
export function assertSiteOpen(site: SiteRecord): void {
  if (site.trialStatus === 'closed') throw closedTrialLocked();
  if (site.publishedAt) throw publishedSiteLocked();
}

/** Locks the site row for a data change and refuses when its report is published or its trial closed. */
export async function lockSiteForChange(
  manager: EntityManager,
  siteId: string,
): Promise<SiteRecord> {
  const site = await loadSite(manager, siteId, { lock: true });
  assertSiteOpen(site);
  return site;
}

/** Reports compare data_version with their snapshot: bump it on every change to site data. */
export async function bumpDataVersion(manager: EntityManager, siteId: string): Promise<number> {
  await manager
    .getRepository(Site)
    .update(siteId, { dataVersion: () => 'data_version + 1', updatedAt: () => 'now()' });
  const site = await manager
    .getRepository(Site)
    .findOne({ select: { id: true, dataVersion: true }, where: { id: siteId } });
  return site!.dataVersion;
}

/** An observation row as the values the forms, imports and reports share. */
export function observationValues(observation: Observation | null | undefined): ObservationValues {
  if (!observation) return { ...EMPTY_OBSERVATION, standCounts: [], headCounts: [] };
  return {
    seedsSown: observation.seedsSown,
    standCounts: (observation.standCounts ?? []).map(Number),
    standRowLength: observation.standRowLength,
    tillerPlants: observation.tillerPlants,
    tillerCount: observation.tillerCount,
    headCounts: (observation.headCounts ?? []).map(Number),
    headRowLength: observation.headRowLength,
    grainWeight: observation.grainWeight,
    harvestRows: observation.harvestRows,
    harvestLength: observation.harvestLength,
    harvestArea: observation.harvestArea,
    moisturePct: observation.moisturePct,
    testWeight: observation.testWeight,
    sowingDate: observation.sowingDate,
    emergenceDate: observation.emergenceDate,
    headingDate: observation.headingDate,
    harvestDate: observation.harvestDate,
    notes: observation.notes ?? '',
  };
}

/** The observations row for a strip's values (the reverse of observationValues). */
function observationRow(
  stripId: string,
  values: ObservationValues,
  actorUserId: string | null,
): Partial<Observation> {
  return {
    stripId,
    ...values,
    standCounts: values.standCounts ?? [],
    headCounts: values.headCounts ?? [],
    notes: values.notes ?? '',
    updatedBy: actorUserId,
    updatedAt: new Date(),
  };
}

export function toStripRecord(strip: Strip): StripRecord {
  return {
    stripId: strip.id,
    siteId: strip.siteId,
    block: strip.block,
    position: strip.position,
    rateLevelId: strip.rateLevelId,
    rate: strip.rateLevel?.multiplier ?? Number.NaN,
    label: strip.rateLevel?.label ?? '',
    version: strip.version,
    values: observationValues(strip.observation),
    hasObservation: Boolean(strip.observation),
    updatedAt: strip.observation?.updatedAt?.toISOString() ?? null,
  };
}

/** Strips with their rate level and observation, in field order (site, block, position). */
export function stripsWithObservations(manager: EntityManager) {
  return manager
    .getRepository(Strip)
    .createQueryBuilder('strip')
    .innerJoinAndSelect('strip.rateLevel', 'level')
    .leftJoinAndSelect('strip.observation', 'observation')
    .orderBy('strip.siteId', 'ASC')
    .addOrderBy('strip.block', 'ASC')
    .addOrderBy('strip.position', 'ASC');
}

export async function loadSiteStrips(
  manager: EntityManager,
  siteId: string,
  options: { lock?: boolean } = {},
): Promise<StripRecord[]> {
  const query = stripsWithObservations(manager).where('strip.siteId = :siteId', { siteId });
  if (options.lock) query.setLock('pessimistic_write', undefined, ['strip']);
  return (await query.getMany()).map(toStripRecord);
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

/**
 * Inserts or replaces the observations of many strips, a thousand rows per statement (a CSV
 * import of 5,000 rows would otherwise make 5,000 round trips). Versions are the caller's.
 */
export async function writeObservationsInBulk(
  manager: EntityManager,
  rows: readonly { stripId: string; values: ObservationValues }[],
  actorUserId: string | null,
): Promise<void> {
  const repository = manager.getRepository(Observation);
  for (let start = 0; start < rows.length; start += 1000) {
    const chunk = rows
      .slice(start, start + 1000)
      .map(({ stripId, values }) => observationRow(stripId, values, actorUserId));
    await repository.upsert(chunk, { conflictPaths: ['stripId'] });
  }
}

/** Moves a strip's version from `version` to the next; false when someone else moved it first. */
export async function advanceStripVersion(
  manager: EntityManager,
  stripId: string,
  version: number,
): Promise<boolean> {
  const result = await manager
    .getRepository(Strip)
    .update({ id: stripId, version }, { version: version + 1 });
  return result.affected === 1;
}

/**
 * Writes one strip's new values in the caller's transaction, after its site is locked and its
 * version advanced: the observation, the audit event and the site's data_version. Returns the
 * observation's new updatedAt (the value written, so the caller need not read it back).
 */
export async function writeStripChange(
  manager: EntityManager,
  change: {
    siteId: string;
    stripId: string;
    values: ObservationValues;
    actorUserId: string;
    before: Record<string, unknown>;
    after: Record<string, unknown>;
  },
): Promise<{ updatedAt: string }> {
  const row = observationRow(change.stripId, change.values, change.actorUserId);
  await manager.getRepository(Observation).upsert(row, { conflictPaths: ['stripId'] });
  await recordAudit(manager, {
    actorUserId: change.actorUserId,
    entityType: 'strip',
    entityId: change.stripId,
    siteId: change.siteId,
    action: 'update',
    before: change.before,
    after: change.after,
  });
  await manager
    .getRepository(Site)
    .update(change.siteId, { dataVersion: () => 'data_version + 1', updatedAt: () => 'now()' });
  return { updatedAt: row.updatedAt!.toISOString() };
}
