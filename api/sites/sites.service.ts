// Site rules: the site detail with its trial's design, RCBD randomization, the strip layout with
// seed weights, and the seeder calibrations a grower records.
import type { DataSource, EntityManager } from 'typeorm';
import { Membership } from '../../db/entities/membership.entity';
import { Network } from '../../db/entities/network.entity';
import { Site } from '../../db/entities/site.entity';
import { Strip } from '../../db/entities/strip.entity';
import { Trial } from '../../db/entities/trial.entity';
import type { ObservationValues } from '../../shared/schemas/observation';
import type { Layout } from '../../shared/schemas/layout';
import type { CalibrationInput, CalibrationRecordDto, SiteDetail } from '../../shared/schemas/site';
import { newRandomizationSeed } from '../../shared/design/randomize-rcbd';
import { randomizeSite } from '../../shared/design/randomize-site';
import { rateTable } from '../../shared/design/rate-table';
import { calibrateSeeder } from '../../shared/units/calibration';
import { plotNumber } from '../../shared/units/plot-number';
import { CROPS, type CropKey } from '../../shared/units/crops';
import { recordAudit } from '../audit/audit.service';
import { Conflict, Locked, NotFound } from '../errors';
import { farmLabel } from '../lib/site-names';
import { findSiteWithDesign, loadSiteStrips, type StripRecord } from '../lib/strip-data';
import { growsSite, isCoordinating } from '../middleware/access';

/** Whether a strip holds anything measured in the field (so the site has been sown). */
function hasFieldData(values: ObservationValues): boolean {
  return (
    values.seedsSown !== null ||
    values.standCounts.length > 0 ||
    values.headCounts.length > 0 ||
    values.tillerCount !== null ||
    values.grainWeight !== null ||
    values.moisturePct !== null ||
    values.testWeight !== null ||
    values.sowingDate !== null ||
    values.emergenceDate !== null ||
    values.headingDate !== null ||
    values.harvestDate !== null
  );
}

/**
 * Sowing is recorded once the site has a sowing date or any strip holds measured data: the
 * grower has started the season, so the map must stay as sown.
 */
function sowingRecorded(site: Site, strips: readonly StripRecord[]): boolean {
  return site.sowingDate !== null || strips.some((strip) => hasFieldData(strip.values));
}

const iso = (value: Date | null) => (value ? value.toISOString() : null);

function trialContext(trial: Trial): SiteDetail['trial'] {
  const cropName =
    trial.crop === 'custom'
      ? (trial.customCrop?.name ?? 'Custom crop')
      : trial.crop
        ? (CROPS[trial.crop as CropKey]?.name ?? trial.crop)
        : null;
  return {
    id: trial.id,
    name: trial.name,
    status: trial.status as SiteDetail['trial']['status'],
    crop: trial.crop,
    cropName,
    season: trial.season,
    unitSystem: trial.unitSystem,
    referenceRate: trial.referenceRate,
    referenceUnit: trial.referenceUnit,
    blocksPerSite: trial.blocksPerSite,
    rowsPerStrip: trial.rowsPerStrip,
    rowSpacingIn: trial.rowSpacingIn,
    stripLengthFt: trial.stripLengthFt,
    borderRows: trial.borderRows,
    thousandKernelWeightG: trial.thousandKernelWeightG,
    germinationPct: trial.germinationPct,
    emergencePct: trial.emergencePct,
    rateLevels: (trial.rateLevels ?? []).map((l) => ({
      id: l.id,
      multiplier: l.multiplier,
      label: l.label,
    })),
  };
}

export function createSitesService(deps: { dataSource: DataSource }) {
  const { dataSource } = deps;

  /** The site's detail; `known` is the site the access check already read for this request. */
  async function get(siteId: string, userId: string, known?: Site): Promise<SiteDetail> {
    const manager = dataSource.manager;
    const site = known?.id === siteId ? known : await findSiteWithDesign(manager, siteId);
    const trial = site.trial!;
    const [network, membership, strips] = await Promise.all([
      manager.getRepository(Network).findOneByOrFail({ id: trial.networkId }),
      manager.getRepository(Membership).findOneBy({ userId, networkId: trial.networkId }),
      loadSiteStrips(manager, siteId),
    ]);
    if (!membership) throw new NotFound('Site');
    const role = membership.role;
    return {
      id: site.id,
      trialId: site.trialId,
      networkId: trial.networkId,
      networkName: network.name,
      trial: trialContext(trial),
      fieldName: site.fieldName,
      soil: site.soil,
      previousCrop: site.previousCrop,
      fertility: site.fertility,
      notes: site.notes,
      grower: {
        userId: site.growerUserId,
        name: site.grower?.name ?? null,
        email: site.grower?.email ?? site.growerEmail,
        invitationPending: site.growerUserId === null && site.growerEmail !== null,
      },
      sowingDate: site.sowingDate,
      emergenceDate: site.emergenceDate,
      headingDate: site.headingDate,
      harvestDate: site.harvestDate,
      randomized: site.randomizedAt !== null,
      randomizationSeed: site.randomizationSeed,
      randomizedAt: iso(site.randomizedAt),
      sowingRecorded: sowingRecorded(site, strips),
      stripCount: strips.length,
      calibrations: (site.calibrations ?? []) as CalibrationRecordDto[],
      publishedAt: iso(site.publishedAt),
      dataVersion: site.dataVersion,
      viewerRole: role,
      isGrower: growsSite(role, site.growerUserId, userId),
      canCoordinate: isCoordinating(role),
      namedInReports: site.namedInReports,
      reportLabel: farmLabel(site.reportNumber),
      lostReason: site.lostReason,
      packetReissuedAt: iso(site.packetReissuedAt),
      createdAt: site.createdAt.toISOString(),
      updatedAt: site.updatedAt.toISOString(),
    };
  }

  /** Locks the site row in the caller's transaction and returns it. */
  async function lockSite(manager: EntityManager, siteId: string): Promise<Site> {
    const site = await manager
      .getRepository(Site)
      .createQueryBuilder('site')
      .setLock('pessimistic_write')
      .where('site.id = :siteId', { siteId })
      .getOne();
    if (!site) throw new NotFound('Site');
    return site;
  }

  /** Draws the site's RCBD map from `seed` (or a new one) and replaces its strips. */
  async function randomize(siteId: string, userId: string, seed?: string): Promise<Layout> {
    await dataSource.transaction(async (manager) => {
      const site = await lockSite(manager, siteId);
      if (site.publishedAt)
        throw new Locked('This site’s report is published: its strip map is final');
      if (sowingRecorded(site, await loadSiteStrips(manager, siteId))) {
        throw new Conflict(
          'Sowing is already recorded for this site (a sowing date or strip data), so its strip map can no longer be re-randomized',
        );
      }
      const trial = await manager
        .getRepository(Trial)
        .findOne({ where: { id: site.trialId }, relations: { rateLevels: true } });
      if (!trial || trial.status !== 'in-field') {
        throw new Conflict(
          'Finish the trial design first: strips are randomized once the trial is in the field',
        );
      }
      const levels = [...(trial.rateLevels ?? [])].sort((a, b) => a.position - b.position);
      const blocks = trial.blocksPerSite ?? 0;
      if (levels.length < 2 || blocks < 1)
        throw new Conflict('The trial needs at least 2 rate levels and 1 block before randomizing');
      const useSeed = seed ?? newRandomizationSeed();
      const map = randomizeSite(
        levels.map((l) => l.id),
        blocks,
        useSeed,
      );
      const strips = manager.getRepository(Strip);
      await strips.delete({ siteId });
      await strips.insert(
        map.flatMap((order, b) =>
          order.map((rateLevelId, p) => ({ siteId, block: b + 1, position: p + 1, rateLevelId })),
        ),
      );
      await manager.getRepository(Site).update(siteId, {
        randomizationSeed: useSeed,
        randomizedAt: () => 'now()',
        dataVersion: () => 'data_version + 1',
        updatedAt: () => 'now()',
      });
      await recordAudit(manager, {
        actorUserId: userId,
        entityType: 'site',
        entityId: siteId,
        siteId,
        action: 'randomize',
        after: { seed: useSeed },
      });
    });
    return layout(siteId);
  }

  async function layout(siteId: string, known?: Site): Promise<Layout> {
    const manager = dataSource.manager;
    const site = known?.id === siteId ? known : await findSiteWithDesign(manager, siteId);
    const trial = trialContext(site.trial!);
    const amounts = new Map(
      rateTable({ ...trial, rateLevels: trial.rateLevels }).map((r) => [r.rateLevelId, r] as const),
    );
    const strips = await manager.getRepository(Strip).find({
      where: { siteId },
      relations: { rateLevel: true },
      order: { block: 'ASC', position: 'ASC' },
    });
    const blocks = new Map<number, Layout['blocks'][number]>();
    for (const s of strips) {
      const amount = amounts.get(s.rateLevelId);
      let block = blocks.get(s.block);
      if (!block) {
        block = { block: s.block, strips: [] };
        blocks.set(s.block, block);
      }
      block.strips.push({
        stripId: s.id,
        position: s.position,
        plotNumber: plotNumber(s.block, s.position),
        rateLevelId: s.rateLevelId,
        rate: s.rateLevel!.multiplier,
        label: s.rateLevel!.label,
        seedGrams: amount ? Math.round(amount.gramsPerStrip * 10) / 10 : 0,
        seedsPerFootOfRow: amount ? Math.round(amount.seedsPerFootOfRow * 100) / 100 : null,
      });
    }
    return {
      siteId,
      seed: site.randomizationSeed ?? '',
      randomizedAt: iso(site.randomizedAt),
      blocks: [...blocks.values()],
    };
  }

  async function addCalibration(
    siteId: string,
    userId: string,
    input: CalibrationInput,
  ): Promise<CalibrationRecordDto[]> {
    const result = calibrateSeeder({
      seedsCounted: input.seedsCounted,
      wheelTurns: input.turns,
      circumferenceFeet: input.wheelCircumferenceFt,
      rowSpacingInches: input.rowSpacingIn,
      targetSeedsPerFootOfRow: input.targetSeedsPerFt,
    });
    const record: CalibrationRecordDto = {
      recordedAt: new Date().toISOString(),
      recordedBy: userId,
      wheelCircumferenceFt: input.wheelCircumferenceFt,
      turns: input.turns,
      seedsCounted: input.seedsCounted,
      targetSeedsPerFt: input.targetSeedsPerFt,
      deliveredSeedsPerFt: Math.round(result.deliveredSeedsPerFootOfRow * 100) / 100,
      percentOfTarget: Math.round(result.percentOfTarget * 10) / 10,
      rateLabel: input.rateLabel,
      note: input.note,
    };
    return dataSource.transaction(async (manager) => {
      const site = await lockSite(manager, siteId);
      if (site.publishedAt)
        throw new Locked('This site’s report is published: its records are read-only');
      const next = [...((site.calibrations ?? []) as CalibrationRecordDto[]), record];
      site.calibrations = next;
      await manager.getRepository(Site).save(site);
      await recordAudit(manager, {
        actorUserId: userId,
        entityType: 'site',
        entityId: siteId,
        siteId,
        action: 'calibrate',
        after: { ...record },
      });
      return next;
    });
  }

  return { get, randomize, layout, addCalibration };
}

export type SitesService = ReturnType<typeof createSitesService>;
