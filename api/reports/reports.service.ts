// Report rules: who sees live data or the published snapshot, publishing with snapshots and
// e-mail, the public link, and the CSV export. Few queries: one for all strips with their
// observations, and published snapshots are served as stored.
import crypto from 'node:crypto';
import { IsNull, type DataSource, type EntityManager } from 'typeorm';
import { Attachment } from '../../db/entities/attachment.entity';
import { ReportSnapshot } from '../../db/entities/report-snapshot.entity';
import { Site } from '../../db/entities/site.entity';
import type { Strip } from '../../db/entities/strip.entity';
import { Trial } from '../../db/entities/trial.entity';
import type {
  PooledQuery,
  PooledReport,
  PublishedInfo,
  ReportPhoto,
  SiteReport,
} from '../../shared/schemas/report';
import { recordAudit } from '../audit/audit.service';
import { Conflict, Forbidden, NotFound } from '../errors';
import { composeMail, type Mailer } from '../mail/mailer';
import { findSiteWithDesign, observationValues, stripsWithObservations } from '../lib/strip-data';
import { growsSite, isCoordinating, type AccessContext } from '../middleware/access';
import { createReportCache, digestOf } from './report-cache';
import { stripsCsv } from './reports.csv';
import {
  buildPooledReport,
  buildSiteReport,
  deriveStrips,
  pooledInput,
  type LevelRow,
  type PooledInput,
  type SiteRow,
  type StripRow,
  trialFactsOf,
  type TrialFacts,
} from './reports.presenter';

export interface ReportsServiceDeps {
  dataSource: DataSource;
  mailer: Mailer;
  publicUrl: string;
}

/** A report with the validator that names its exact content (sent as the ETag). */
export interface Tagged<T> {
  etag: string;
  report: T;
}

interface TrialRecord extends TrialFacts {
  networkId: string;
  publicLinkToken: string | null;
  levels: LevelRow[];
}

function toTrial(trial: Trial): TrialRecord {
  return {
    ...trialFactsOf(trial),
    networkId: trial.networkId,
    publicLinkToken: trial.publicLinkToken,
    levels: [...(trial.rateLevels ?? [])]
      .sort((a, b) => a.position - b.position)
      .map((l) => ({ id: l.id, position: l.position, multiplier: l.multiplier, label: l.label })),
  };
}

function toSite(site: Site): SiteRow {
  return {
    id: site.id,
    trialId: site.trialId,
    fieldName: site.fieldName,
    growerName: site.grower?.name ?? null,
    soil: site.soil ?? '',
    previousCrop: site.previousCrop ?? '',
    fertility: site.fertility ?? '',
    notes: site.notes ?? '',
    sowingDate: site.sowingDate,
    emergenceDate: site.emergenceDate,
    headingDate: site.headingDate,
    harvestDate: site.harvestDate,
    published: site.publishedAt !== null,
    dataVersion: site.dataVersion,
  };
}

function toStrip(strip: Strip): StripRow {
  return {
    id: strip.id,
    siteId: strip.siteId,
    block: strip.block,
    position: strip.position,
    rateLevelId: strip.rateLevelId,
    observation: strip.observation ? observationValues(strip.observation) : null,
  };
}

/**
 * Names how live report bodies are worked out (2: metric yields in t/ha, were kg/ha). It is part
 * of their ETags, so a browser's cached body and a PDF printed earlier the same day are not
 * served once the numbers are given in another unit.
 */
const LIVE_REPORT_FORMAT = 2;

const toPublished = (snapshot: ReportSnapshot | null): PublishedInfo | null =>
  snapshot
    ? {
        snapshotId: snapshot.id,
        publishedAt: snapshot.publishedAt.toISOString(),
        publishedBy: snapshot.publisher?.name ?? null,
        dataVersion: snapshot.dataVersion,
      }
    : null;

/** The live published snapshot of a site or a trial's pooled report, without its body. */
function latestSnapshot(
  manager: EntityManager,
  where: { siteId: string; scope: 'site' } | { trialId: string; scope: 'pooled' },
): Promise<ReportSnapshot | null> {
  // The query builder with limit(1), not findOne: findOne with a relation costs two queries.
  const query = manager
    .getRepository(ReportSnapshot)
    .createQueryBuilder('snapshot')
    .leftJoin('snapshot.publisher', 'publisher')
    .select([
      'snapshot.id',
      'snapshot.dataVersion',
      'snapshot.publishedAt',
      'publisher.id',
      'publisher.name',
    ])
    .where('snapshot.scope = :scope', { scope: where.scope })
    .andWhere('snapshot.withdrawnAt IS NULL')
    .orderBy('snapshot.publishedAt', 'DESC')
    .limit(1);
  if ('siteId' in where) query.andWhere('snapshot.siteId = :siteId', { siteId: where.siteId });
  else query.andWhere('snapshot.trialId = :trialId', { trialId: where.trialId });
  return query.getOne();
}

/** A published snapshot's stored body. */
async function snapshotBody(manager: EntityManager, id: string): Promise<Record<string, unknown>> {
  const snapshot = await manager
    .getRepository(ReportSnapshot)
    .findOne({ select: { id: true, report: true }, where: { id } });
  if (!snapshot) throw new NotFound('Report');
  return snapshot.report;
}

/** Withdraws the live snapshots of a site or a trial's pooled report; returns their ids. */
async function withdrawSnapshots(
  manager: EntityManager,
  where: { siteId: string; scope: 'site' } | { trialId: string; scope: 'pooled' },
): Promise<string[]> {
  const repository = manager.getRepository(ReportSnapshot);
  const live = await repository.find({
    select: { id: true },
    where: { ...where, withdrawnAt: IsNull() },
  });
  if (live.length > 0)
    await repository.update(
      live.map((s) => s.id),
      { withdrawnAt: new Date() },
    );
  return live.map((s) => s.id);
}

/** A digest of every site's data version and the rate levels: changes when any pooled input changes. */
function pooledDigest(trial: TrialRecord, sites: readonly SiteRow[]): string {
  const parts = [
    ...trial.levels.map((l) => `level:${l.id}:${l.multiplier}`),
    ...sites.map((s) => `site:${s.id}:${s.dataVersion}`),
  ].sort();
  return crypto.createHash('sha256').update(parts.join('\n')).digest('hex').slice(0, 32);
}

/** The caller reads live data when they coordinate the network or grow this site now. */
function readsLive(
  access: AccessContext | null,
  networkId: string,
  growerUserId: string | null,
): boolean {
  if (!access) return false;
  const role = access.roles.get(networkId);
  return isCoordinating(role) || growsSite(role, growerUserId, access.userId);
}

const hasQuery = (query: PooledQuery) => Object.values(query).some((v) => v !== undefined);

export function createReportsService(deps: ReportsServiceDeps) {
  const { dataSource } = deps;
  // Computed report bodies keyed by a digest of every input, which each request reads afresh from
  // PostgreSQL: a change to any input changes the key, so a stale body is never served.
  const siteBodies = createReportCache<Awaited<ReturnType<typeof buildSiteReport>>>();
  const pooledBodies = createReportCache<ReturnType<typeof buildPooledReport>>(100);

  /** The site's report inputs; `known` is the site the access check already read for this request. */
  async function loadSiteBundle(manager: EntityManager, siteId: string, known?: Site) {
    const site = known?.id === siteId ? known : await findSiteWithDesign(manager, siteId);
    const snapshot = await latestSnapshot(manager, { siteId, scope: 'site' });
    return {
      trial: toTrial(site.trial!),
      site: toSite(site),
      growerUserId: site.growerUserId,
      growerEmail: (site.grower?.email ?? site.growerEmail) || null,
      snapshot,
    };
  }

  async function loadStrips(
    manager: EntityManager,
    where: { siteId: string } | { trialId: string },
  ): Promise<StripRow[]> {
    const query = stripsWithObservations(manager);
    if ('siteId' in where) query.where('strip.siteId = :siteId', where);
    else query.innerJoin('strip.site', 'site').where('site.trialId = :trialId', where);
    return (await query.getMany()).map(toStrip);
  }

  async function loadPhotos(manager: EntityManager, siteId: string): Promise<ReportPhoto[]> {
    const photos = await manager.getRepository(Attachment).find({
      select: { id: true, caption: true, stripId: true },
      where: { siteId },
      order: { createdAt: 'ASC' },
    });
    return photos.map((p) => ({
      id: p.id,
      caption: p.caption ?? '',
      stripId: p.stripId,
      url: `/api/photos/${p.id}`,
    }));
  }

  /** The live site report; pass the photos when the caller has loaded them already. */
  async function liveSiteBody(
    manager: EntityManager,
    bundle: Awaited<ReturnType<typeof loadSiteBundle>>,
    knownPhotos?: ReportPhoto[],
  ) {
    const strips = await loadStrips(manager, { siteId: bundle.site.id });
    const photos = knownPhotos ?? (await loadPhotos(manager, bundle.site.id));
    return buildSiteReport({
      trial: bundle.trial,
      levels: bundle.trial.levels,
      site: bundle.site,
      strips,
      photos,
    });
  }

  /**
   * The site report as this caller may read it: live for its coordinators and its grower, the
   * published snapshot for everyone else. The ETag names the inputs and the caller's view.
   */
  async function siteReport(
    siteId: string,
    access: AccessContext | null,
    known?: Site,
  ): Promise<Tagged<SiteReport>> {
    const manager = dataSource.manager;
    const bundle = await loadSiteBundle(manager, siteId, known);
    const published = toPublished(bundle.snapshot);
    const changed =
      !!bundle.snapshot && bundle.snapshot.dataVersion !== String(bundle.site.dataVersion);
    const canPublish = !!access && isCoordinating(access.roles.get(bundle.trial.networkId));
    if (!readsLive(access, bundle.trial.networkId, bundle.growerUserId)) {
      if (!bundle.snapshot) throw new Forbidden('This site report is not published yet');
      const stored = (await snapshotBody(manager, bundle.snapshot.id)) as unknown as SiteReport;
      return {
        etag: digestOf('site-published', bundle.snapshot.id, changed, canPublish),
        report: {
          ...stored,
          published,
          dataChangedSincePublished: changed,
          fromSnapshot: true,
          canPublish,
        },
      };
    }
    const photos = await loadPhotos(manager, bundle.site.id);
    const bodyKey = digestOf('site', LIVE_REPORT_FORMAT, bundle.trial, bundle.site, photos);
    const body = await siteBodies.getOrCompute(bodyKey, () =>
      liveSiteBody(manager, bundle, photos),
    );
    return {
      etag: digestOf('site-live', bodyKey, published, changed, canPublish),
      report: {
        ...body,
        published,
        dataChangedSincePublished: changed,
        fromSnapshot: false,
        canPublish,
      },
    };
  }

  async function loadTrialBundle(manager: EntityManager, trialId: string) {
    const trial = await manager
      .getRepository(Trial)
      .createQueryBuilder('trial')
      .leftJoinAndSelect('trial.rateLevels', 'level')
      .where('trial.id = :trialId', { trialId })
      .getOne();
    if (!trial) throw new NotFound('Trial');
    const sites = await manager.getRepository(Site).find({
      where: { trialId },
      relations: { grower: true },
      order: { createdAt: 'ASC', fieldName: 'ASC' },
    });
    const snapshot = await latestSnapshot(manager, { trialId, scope: 'pooled' });
    const record = toTrial(trial);
    const siteRows = sites.map(toSite);
    return { trial: record, sites: siteRows, snapshot, digest: pooledDigest(record, siteRows) };
  }

  async function livePooledInput(
    manager: EntityManager,
    bundle: Awaited<ReturnType<typeof loadTrialBundle>>,
  ): Promise<PooledInput> {
    const strips = await loadStrips(manager, { trialId: bundle.trial.id });
    return pooledInput(bundle.trial, bundle.trial.levels, bundle.sites, strips);
  }

  /**
   * The pooled report: live for the network's coordinators, the published snapshot for everyone
   * else (re-analysed when they narrow it with a query).
   */
  async function pooledReport(
    trialId: string,
    access: AccessContext | null,
    query: PooledQuery,
  ): Promise<Tagged<PooledReport>> {
    const manager = dataSource.manager;
    const bundle = await loadTrialBundle(manager, trialId);
    const published = toPublished(bundle.snapshot);
    const changed = !!bundle.snapshot && bundle.snapshot.dataVersion !== bundle.digest;
    const coordinating = !!access && isCoordinating(access.roles.get(bundle.trial.networkId));
    if (!coordinating) {
      if (!bundle.snapshot) throw new Forbidden('The pooled report is not published yet');
      const snapshotId = bundle.snapshot.id;
      const bodyKey = digestOf('pooled-published', snapshotId, query);
      const body = await pooledBodies.getOrCompute(bodyKey, async () => {
        const stored = (await snapshotBody(manager, snapshotId)) as unknown as {
          report: PooledReport;
          input: PooledInput;
        };
        return hasQuery(query) ? buildPooledReport(stored.input, query) : stored.report;
      });
      return {
        etag: digestOf(bodyKey, published, changed),
        report: {
          ...body,
          published,
          dataChangedSincePublished: changed,
          fromSnapshot: true,
          canPublish: false,
          publicLinkToken: null,
        },
      };
    }
    const bodyKey = digestOf('pooled', LIVE_REPORT_FORMAT, bundle.trial, bundle.sites, query);
    const body = await pooledBodies.getOrCompute(bodyKey, async () =>
      buildPooledReport(await livePooledInput(manager, bundle), query),
    );
    return {
      etag: digestOf(bodyKey, published, changed, bundle.trial.publicLinkToken),
      report: {
        ...body,
        published,
        dataChangedSincePublished: changed,
        fromSnapshot: false,
        canPublish: true,
        publicLinkToken: bundle.trial.publicLinkToken,
      },
    };
  }

  async function publicReport(token: string, query: PooledQuery): Promise<Tagged<PooledReport>> {
    const trial = await dataSource
      .getRepository(Trial)
      .findOne({ select: { id: true }, where: { publicLinkToken: token } });
    if (!trial) throw new NotFound('Report');
    try {
      return await pooledReport(trial.id, null, query);
    } catch (error) {
      if (error instanceof Forbidden) throw new NotFound('Report');
      throw error;
    }
  }

  const coordinatorOf = (userId: string, networkId: string): AccessContext => ({
    userId,
    roles: new Map([[networkId, 'coordinator']]),
  });

  /** Locks a site row in the caller's transaction (publishing waits for strip changes). */
  async function lockSite(manager: EntityManager, siteId: string): Promise<void> {
    const locked = await manager
      .getRepository(Site)
      .createQueryBuilder('site')
      .select('site.id')
      .setLock('pessimistic_write')
      .where('site.id = :siteId', { siteId })
      .getOne();
    if (!locked) throw new NotFound('Site');
  }

  /** Locks a trial row in the caller's transaction. */
  async function lockTrial(manager: EntityManager, trialId: string): Promise<Trial> {
    const trial = await manager
      .getRepository(Trial)
      .createQueryBuilder('trial')
      .setLock('pessimistic_write')
      .where('trial.id = :trialId', { trialId })
      .getOne();
    if (!trial) throw new NotFound('Trial');
    return trial;
  }

  async function publishSite(
    siteId: string,
    actorUserId: string,
  ): Promise<{ report: SiteReport; mailed: boolean }> {
    const bundle = await dataSource.transaction(async (manager) => {
      await lockSite(manager, siteId);
      const bundle = await loadSiteBundle(manager, siteId);
      const body = await liveSiteBody(manager, bundle);
      if (!body.analysis)
        throw new Conflict(
          `This site cannot be published yet: ${body.analysisError ?? 'no analysis'}`,
        );
      await withdrawSnapshots(manager, { siteId, scope: 'site' });
      const snapshot = await manager.getRepository(ReportSnapshot).save({
        scope: 'site',
        trialId: bundle.trial.id,
        siteId,
        dataVersion: String(bundle.site.dataVersion),
        report: body as unknown as Record<string, unknown>,
        publishedBy: actorUserId,
      });
      await manager.getRepository(Site).update(siteId, { publishedAt: () => 'now()' });
      await recordAudit(manager, {
        actorUserId,
        entityType: 'site',
        entityId: siteId,
        siteId,
        action: 'report.publish',
        after: { snapshotId: snapshot.id, dataVersion: bundle.site.dataVersion },
      });
      return bundle;
    });
    let mailed = false;
    if (bundle.growerEmail) {
      try {
        await deps.mailer.send(
          composeMail({
            to: bundle.growerEmail,
            subject: `Your site report is ready: ${bundle.site.fieldName}`,
            paragraphs: [
              `Hello${bundle.site.growerName ? ` ${bundle.site.growerName}` : ''},`,
              `The coordinator of “${bundle.trial.name}” has published the report for your site, ${bundle.site.fieldName}. It shows how each seeding rate yielded in your strips, what the differences mean, and what one season at one field can and cannot tell.`,
              'Your strip data are now locked so the published numbers stay as they are. If something needs correcting, ask your coordinator to unpublish the report.',
            ],
            link: {
              label: 'Read your site report',
              url: `${deps.publicUrl.replace(/\/$/, '')}/sites/${siteId}/report`,
            },
          }),
        );
        mailed = true;
      } catch {
        mailed = false;
      }
    }
    const { report } = await siteReport(siteId, coordinatorOf(actorUserId, bundle.trial.networkId));
    return { report, mailed };
  }

  async function unpublishSite(siteId: string, actorUserId: string): Promise<SiteReport> {
    const networkId = await dataSource.transaction(async (manager) => {
      await lockSite(manager, siteId);
      const site = await findSiteWithDesign(manager, siteId);
      const withdrawn = await withdrawSnapshots(manager, { siteId, scope: 'site' });
      await manager.getRepository(Site).update(siteId, { publishedAt: null });
      await recordAudit(manager, {
        actorUserId,
        entityType: 'site',
        entityId: siteId,
        siteId,
        action: 'report.unpublish',
        before: { snapshotIds: withdrawn },
      });
      return site.trial!.networkId;
    });
    return (await siteReport(siteId, coordinatorOf(actorUserId, networkId))).report;
  }

  async function publishTrial(trialId: string, actorUserId: string): Promise<PooledReport> {
    const networkId = await dataSource.transaction(async (manager) => {
      await lockTrial(manager, trialId);
      const bundle = await loadTrialBundle(manager, trialId);
      const input = await livePooledInput(manager, bundle);
      const report = buildPooledReport(input, {});
      if (!report.analysis)
        throw new Conflict(
          `The pooled report cannot be published yet: ${report.analysisError ?? 'no analysis'}`,
        );
      await withdrawSnapshots(manager, { trialId, scope: 'pooled' });
      const snapshot = await manager.getRepository(ReportSnapshot).save({
        scope: 'pooled',
        trialId,
        siteId: null,
        dataVersion: bundle.digest,
        report: { report, input } as unknown as Record<string, unknown>,
        publishedBy: actorUserId,
      });
      await recordAudit(manager, {
        actorUserId,
        entityType: 'trial',
        entityId: trialId,
        action: 'report.publish',
        after: {
          snapshotId: snapshot.id,
          digest: bundle.digest,
          sites: report.sitesIncluded.length,
        },
      });
      return bundle.trial.networkId;
    });
    return (await pooledReport(trialId, coordinatorOf(actorUserId, networkId), {})).report;
  }

  async function unpublishTrial(trialId: string, actorUserId: string): Promise<PooledReport> {
    const networkId = await dataSource.transaction(async (manager) => {
      const trial = await lockTrial(manager, trialId);
      await withdrawSnapshots(manager, { trialId, scope: 'pooled' });
      // A withdrawn report must not stay reachable from a link handed out earlier.
      await manager.getRepository(Trial).update(trialId, { publicLinkToken: null });
      await recordAudit(manager, {
        actorUserId,
        entityType: 'trial',
        entityId: trialId,
        action: 'report.unpublish',
      });
      return trial.networkId;
    });
    return (await pooledReport(trialId, coordinatorOf(actorUserId, networkId), {})).report;
  }

  async function setPublicLink(
    trialId: string,
    enabled: boolean,
    actorUserId: string,
  ): Promise<{ token: string | null }> {
    return dataSource.transaction(async (manager) => {
      const trial = await lockTrial(manager, trialId);
      const trials = manager.getRepository(Trial);
      if (!enabled) {
        await trials.update(trialId, { publicLinkToken: null });
        await recordAudit(manager, {
          actorUserId,
          entityType: 'trial',
          entityId: trialId,
          action: 'report.public-link.off',
        });
        return { token: null };
      }
      if (trial.publicLinkToken) return { token: trial.publicLinkToken };
      const published = await manager
        .getRepository(ReportSnapshot)
        .exists({ where: { trialId, scope: 'pooled', withdrawnAt: IsNull() } });
      if (!published) throw new Conflict('Publish the pooled report before sharing a public link');
      const token = crypto.randomBytes(24).toString('base64url');
      await trials.update(trialId, { publicLinkToken: token });
      await recordAudit(manager, {
        actorUserId,
        entityType: 'trial',
        entityId: trialId,
        action: 'report.public-link.on',
      });
      return { token };
    });
  }

  async function exportCsv(trialId: string): Promise<{ fileName: string; csv: string }> {
    const manager = dataSource.manager;
    const bundle = await loadTrialBundle(manager, trialId);
    const strips = await loadStrips(manager, { trialId });
    const derived = deriveStrips(bundle.trial, bundle.trial.levels, strips);
    const csv = stripsCsv(bundle.trial, bundle.sites, derived);
    const slug =
      bundle.trial.name
        .toLowerCase()
        .replace(/[^a-z0-9]+/g, '-')
        .replace(/^-|-$/g, '') || 'trial';
    return { fileName: `${slug}-strips.csv`, csv };
  }

  return {
    siteReport,
    pooledReport,
    publicReport,
    publishSite,
    unpublishSite,
    publishTrial,
    unpublishTrial,
    setPublicLink,
    exportCsv,
  };
}

export type ReportsService = ReturnType<typeof createReportsService>;
