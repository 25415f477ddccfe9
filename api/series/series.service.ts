// Series rules: start a series, link trials of its crop in its network, and pool them by season.
import crypto from 'node:crypto';
import { In, IsNull, type DataSource, type EntityManager } from 'typeorm';
import { Network } from '../../db/entities/network.entity';
import { ReportSnapshot } from '../../db/entities/report-snapshot.entity';
import { Site } from '../../db/entities/site.entity';
import { Trial } from '../../db/entities/trial.entity';
import { TrialSeries } from '../../db/entities/trial-series.entity';
import { cropLabel } from '../../shared/labels/labels';
import { buildSeriesReport, type SeriesSeasonInput } from '../../shared/reports/series-report';
import type { DerivedValues } from '../../shared/schemas/observation';
import { KILOGRAMS_PER_TONNE } from '../../shared/units/constants';
import type {
  CreateSeriesInput,
  LinkTrialSeriesInput,
  SeriesDetail,
  SeriesReport,
  SeriesSummary,
  SeriesTrial,
} from '../../shared/schemas/series';
import { recordAudit } from '../audit/audit.service';
import { Forbidden, NotFound, ValidationError } from '../errors';
import { siteNameFor } from '../lib/site-names';
import { observationValues, stripsWithObservations } from '../lib/strip-data';
import { isCoordinating, type AccessContext } from '../middleware/access';
import { deriveStrips, METRIC_YIELD_UNIT, trialFactsOf } from '../reports/reports.presenter';

/** A site joins the pool with yield on at least this share of its strips (as the pooled report). */
const MIN_COMPLETE_SHARE = 0.75;

/** A strip's yield in t/ha, whatever the unit system of the season it came from. */
const tonnesPerHectare = (derived: DerivedValues | null): number | null =>
  derived?.yieldKilogramsPerHectare == null
    ? null
    : derived.yieldKilogramsPerHectare / KILOGRAMS_PER_TONNE;

const toTrialRow = (trial: Trial): SeriesTrial => ({
  id: trial.id,
  name: trial.name,
  season: trial.season,
  status: trial.status,
});

const bySeason = (a: Trial, b: Trial) =>
  (a.season ?? '').localeCompare(b.season ?? '') || a.name.localeCompare(b.name);

export function createSeriesService(deps: { dataSource: DataSource }) {
  const { dataSource } = deps;

  async function summaries(manager: EntityManager, rows: TrialSeries[]): Promise<SeriesSummary[]> {
    if (rows.length === 0) return [];
    const trials = await manager.getRepository(Trial).find({
      select: { id: true, name: true, season: true, status: true, seriesId: true },
      where: { seriesId: In(rows.map((r) => r.id)) },
    });
    const networks = await manager.getRepository(Network).find({
      select: { id: true, name: true },
      where: { id: In([...new Set(rows.map((r) => r.networkId))]) },
    });
    return rows.map((row) => ({
      id: row.id,
      networkId: row.networkId,
      networkName: networks.find((n) => n.id === row.networkId)?.name ?? '',
      name: row.name,
      crop: row.crop,
      createdAt: row.createdAt.toISOString(),
      trials: trials
        .filter((t) => t.seriesId === row.id)
        .sort(bySeason)
        .map(toTrialRow),
    }));
  }

  async function findSeries(manager: EntityManager, seriesId: string): Promise<TrialSeries> {
    const series = await manager.getRepository(TrialSeries).findOne({ where: { id: seriesId } });
    if (!series) throw new NotFound('Series');
    return series;
  }

  /** Every series in the caller's networks. */
  async function list(access: AccessContext): Promise<SeriesSummary[]> {
    const networkIds = [...access.roles.keys()];
    if (networkIds.length === 0) return [];
    const rows = await dataSource.getRepository(TrialSeries).find({
      where: { networkId: In(networkIds) },
      order: { createdAt: 'ASC' },
    });
    return summaries(dataSource.manager, rows);
  }

  async function get(seriesId: string, access: AccessContext): Promise<SeriesDetail> {
    const series = await findSeries(dataSource.manager, seriesId);
    const [summary] = await summaries(dataSource.manager, [series]);
    const canEdit = isCoordinating(access.roles.get(series.networkId));
    const candidates = canEdit
      ? (
          await dataSource.getRepository(Trial).find({
            select: { id: true, name: true, season: true, status: true, seriesId: true },
            where: { networkId: series.networkId, crop: series.crop },
          })
        )
          .filter((t) => t.seriesId !== series.id)
          .sort(bySeason)
          .map(toTrialRow)
      : [];
    return { ...summary!, canEdit, candidates };
  }

  async function create(access: AccessContext, input: CreateSeriesInput): Promise<SeriesDetail> {
    let networkId = input.networkId;
    if (networkId) {
      const role = access.roles.get(networkId);
      if (!role) throw new NotFound('Network');
      if (!isCoordinating(role))
        throw new Forbidden('Only a coordinator of this network can start a series');
    } else {
      const coordinating = [...access.roles].filter(([, role]) => isCoordinating(role));
      if (coordinating.length === 0)
        throw new Forbidden('Only a coordinator of a network can start a series');
      if (coordinating.length > 1)
        throw new ValidationError('Choose the network for this series', {
          networkId: 'You coordinate more than one network: choose one',
        });
      networkId = coordinating[0]![0];
    }
    const id = await dataSource.transaction(async (manager) => {
      const saved = await manager.getRepository(TrialSeries).save(
        manager.getRepository(TrialSeries).create({
          networkId,
          name: input.name,
          crop: input.crop,
          createdBy: access.userId,
        }),
      );
      await recordAudit(manager, {
        actorUserId: access.userId,
        entityType: 'series',
        entityId: saved.id,
        action: 'create',
        after: { name: input.name, crop: input.crop },
      });
      return saved.id;
    });
    return get(id, access);
  }

  /** Links a trial to a series of its crop in its network, or unlinks it (seriesId null). */
  async function link(
    trialId: string,
    access: AccessContext,
    input: LinkTrialSeriesInput,
  ): Promise<{ trialId: string; seriesId: string | null }> {
    return dataSource.transaction(async (manager) => {
      const trial = await manager
        .getRepository(Trial)
        .createQueryBuilder('trial')
        .setLock('pessimistic_write')
        .where('trial.id = :trialId', { trialId })
        .getOne();
      if (!trial) throw new NotFound('Trial');
      if (input.seriesId !== null) {
        const series = await manager
          .getRepository(TrialSeries)
          .findOne({ where: { id: input.seriesId } });
        if (!series || series.networkId !== trial.networkId)
          throw new ValidationError('No such series in this trial’s network', {
            seriesId: 'Choose a series of this trial’s network',
          });
        if (series.crop !== trial.crop)
          throw new ValidationError('The trial’s crop differs from the series’ crop', {
            seriesId: `This series is for ${cropLabel(series.crop)}; the trial is ${trial.crop ? cropLabel(trial.crop) : 'without a crop'}`,
          });
        if (!trial.season?.trim())
          throw new ValidationError('The trial has no season', {
            seriesId: 'Set the trial’s season before adding it to a series',
          });
      }
      await manager.getRepository(Trial).update({ id: trialId }, { seriesId: input.seriesId });
      await recordAudit(manager, {
        actorUserId: access.userId,
        entityType: 'trial',
        entityId: trialId,
        action: 'series',
        before: { seriesId: trial.seriesId },
        after: { seriesId: input.seriesId },
      });
      return { trialId, seriesId: input.seriesId };
    });
  }

  /**
   * What the series report is computed from, read fresh: the series, its trials and their
   * levels, every site's data version, and which pooled reports are published. Its digest is
   * the ETag, so a repeat read costs these small queries and a 304.
   */
  async function reportInputs(seriesId: string, access: AccessContext) {
    const manager = dataSource.manager;
    const series = await findSeries(manager, seriesId);
    const coordinating = isCoordinating(access.roles.get(series.networkId));
    const all = await manager
      .getRepository(Trial)
      .createQueryBuilder('trial')
      .leftJoinAndSelect('trial.rateLevels', 'level')
      .where('trial.seriesId = :seriesId', { seriesId })
      .getMany();
    const published = new Set(
      all.length === 0
        ? []
        : (
            await manager.getRepository(ReportSnapshot).find({
              select: { id: true, trialId: true },
              where: { trialId: In(all.map((t) => t.id)), scope: 'pooled', withdrawnAt: IsNull() },
            })
          ).map((s) => s.trialId),
    );
    // Members and growers see a season once its pooled report is published.
    const trials = all.filter((t) => coordinating || published.has(t.id)).sort(bySeason);
    const sites =
      trials.length === 0
        ? []
        : await manager.getRepository(Site).find({
            where: { trialId: In(trials.map((t) => t.id)) },
            order: { reportNumber: 'ASC' },
          });
    const etag = crypto
      .createHash('sha256')
      .update(
        JSON.stringify([
          series,
          coordinating,
          access.userId,
          all.length,
          trials.map((t) => [t, [...published].includes(t.id)]),
          sites.map((s) => [s.id, s.dataVersion, s.lostReason, s.namedInReports, s.fieldName]),
        ]),
      )
      .digest('base64url')
      .slice(0, 32);
    return { series, coordinating, trials, sites, hidden: all.length - trials.length, etag };
  }

  async function report(
    inputs: Awaited<ReturnType<typeof reportInputs>>,
    access: AccessContext,
  ): Promise<SeriesReport> {
    const { series, trials, sites } = inputs;
    const strips =
      trials.length === 0
        ? []
        : await stripsWithObservations(dataSource.manager)
            .innerJoin('strip.site', 'site')
            .where('site.trialId IN (:...trialIds)', { trialIds: trials.map((t) => t.id) })
            .getMany();
    const metric = trials.at(-1)?.unitSystem === 'metric';
    const viewer = { userId: access.userId, role: access.roles.get(series.networkId) };
    const seasons: SeriesSeasonInput[] = trials.map((trial) => {
      const levels = (trial.rateLevels ?? []).map((l) => ({
        id: l.id,
        position: l.position,
        multiplier: l.multiplier,
        label: l.label,
      }));
      const mine = sites.filter((s) => s.trialId === trial.id);
      const derived = deriveStrips(
        trialFactsOf(trial),
        levels,
        strips
          .filter((s) => mine.some((site) => site.id === s.siteId))
          .map((s) => ({
            id: s.id,
            siteId: s.siteId,
            block: s.block,
            position: s.position,
            rateLevelId: s.rateLevelId,
            observation: s.observation ? observationValues(s.observation) : null,
          })),
      );
      const included: SeriesSeasonInput['sites'][number][] = [];
      const leftOut: { name: string; reason: string }[] = [];
      for (const site of mine) {
        const name = siteNameFor(site, viewer);
        const rows = derived
          .filter((d) => d.strip.siteId === site.id)
          .map((d) => ({
            block: String(d.strip.block),
            rate: d.rate,
            value: metric ? tonnesPerHectare(d.derived) : (d.derived?.yieldBushelsPerAcre ?? null),
          }));
        const withYield = rows.filter((r) => r.value !== null).length;
        const reason = site.lostReason
          ? `lost (${site.lostReason})`
          : rows.length === 0
            ? 'no strips yet'
            : withYield < MIN_COMPLETE_SHARE * rows.length
              ? `incomplete: ${withYield} of ${rows.length} strips have a yield`
              : null;
        if (reason) leftOut.push({ name, reason });
        else included.push({ name: `${trial.id}:${site.id}`, rows });
      }
      return {
        season: trial.season ?? trial.name,
        trialId: trial.id,
        trialName: trial.name,
        rates: levels.map((l) => ({ key: String(Number(l.multiplier)), label: l.label })),
        sites: included,
        leftOut,
      };
    });
    const body = buildSeriesReport({
      series: {
        id: series.id,
        name: series.name,
        crop: series.crop,
        cropName: cropLabel(series.crop),
      },
      unit: metric ? METRIC_YIELD_UNIT : 'bu/acre',
      seasons,
    });
    return { ...body, unpublishedTrials: inputs.hidden, canLink: inputs.coordinating };
  }

  return { list, get, create, link, reportInputs, report };
}

export type SeriesService = ReturnType<typeof createSeriesService>;
