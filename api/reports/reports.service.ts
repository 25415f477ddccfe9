// Report rules: who sees live data or the published snapshot, publishing with snapshots and
// e-mail, the public link, and the CSV export. Few queries: one for all strips with their
// observations, and published snapshots are served as stored.
import crypto from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import type { ObservationValues } from '../../shared/schemas/observation';
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
import { isCoordinating, type AccessContext } from '../middleware/access';
import { preparedQuery } from '../../db/prepared';
import { createFreshCache } from '../lib/fresh-cache';
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
  type TrialFacts,
} from './reports.presenter';

type Queryable = Pick<DataSource | EntityManager, 'query'>;

export interface ReportsServiceDeps {
  dataSource: DataSource;
  mailer: Mailer;
  publicUrl: string;
}

const num = (value: unknown): number | null =>
  value === null || value === undefined ? null : Number(value);

interface TrialRecord extends TrialFacts {
  networkId: string;
  publicLinkToken: string | null;
  levels: LevelRow[];
}

const TRIAL_COLUMNS = `t.id AS trial_id, t.network_id, t.name AS trial_name, t.question, t.crop, t.custom_crop, t.season,
  t.unit_system, t.reference_rate, t.reference_unit, t.blocks_per_site, t.row_spacing_in, t.thousand_kernel_weight_g,
  t.seed_price_per_lb, t.grain_price_per_bu, t.public_link_token,
  (SELECT coalesce(json_agg(json_build_object('id', r.id, 'position', r.position, 'multiplier', r.multiplier, 'label', r.label)
     ORDER BY r.position), '[]') FROM rate_levels r WHERE r.trial_id = t.id) AS levels`;

function toTrial(row: Record<string, unknown>): TrialRecord {
  return {
    id: row.trial_id as string,
    networkId: row.network_id as string,
    name: row.trial_name as string,
    question: (row.question as string) ?? '',
    crop: (row.crop as TrialFacts['crop']) ?? null,
    customCrop: (row.custom_crop as TrialFacts['customCrop']) ?? null,
    season: (row.season as string) ?? null,
    unitSystem: (row.unit_system as TrialFacts['unitSystem']) ?? 'imperial',
    referenceRate: num(row.reference_rate),
    referenceUnit: (row.reference_unit as TrialFacts['referenceUnit']) ?? null,
    blocksPerSite: num(row.blocks_per_site),
    rowSpacingIn: num(row.row_spacing_in),
    thousandKernelWeightG: num(row.thousand_kernel_weight_g),
    seedPricePerLb: num(row.seed_price_per_lb),
    grainPricePerBu: num(row.grain_price_per_bu),
    publicLinkToken: (row.public_link_token as string) ?? null,
    levels: (
      (row.levels as {
        id: string;
        position: number;
        multiplier: number | string;
        label: string;
      }[]) ?? []
    ).map((l) => ({
      id: l.id,
      position: l.position,
      multiplier: Number(l.multiplier),
      label: l.label,
    })),
  };
}

const SITE_COLUMNS = `s.id, s.trial_id, s.field_name, s.soil, s.previous_crop, s.fertility, s.notes,
  s.sowing_date::text AS sowing_date, s.emergence_date::text AS emergence_date, s.heading_date::text AS heading_date,
  s.harvest_date::text AS harvest_date, s.published_at IS NOT NULL AS published, s.data_version, s.grower_user_id,
  s.grower_email, u.name AS grower_name, u.email AS grower_user_email`;

function toSite(row: Record<string, unknown>): SiteRow {
  return {
    id: row.id as string,
    trialId: row.trial_id as string,
    fieldName: row.field_name as string,
    growerName: (row.grower_name as string) ?? null,
    soil: (row.soil as string) ?? '',
    previousCrop: (row.previous_crop as string) ?? '',
    fertility: (row.fertility as string) ?? '',
    notes: (row.notes as string) ?? '',
    sowingDate: (row.sowing_date as string) ?? null,
    emergenceDate: (row.emergence_date as string) ?? null,
    headingDate: (row.heading_date as string) ?? null,
    harvestDate: (row.harvest_date as string) ?? null,
    published: Boolean(row.published),
    dataVersion: Number(row.data_version ?? 0),
  };
}

const STRIP_SQL = `SELECT st.id, st.site_id, st.block, st.position, st.rate_level_id, o.strip_id AS observed,
    o.seeds_sown, o.stand_counts, o.stand_row_length, o.tiller_plants, o.tiller_count, o.head_counts, o.head_row_length,
    o.grain_weight, o.harvest_rows, o.harvest_length, o.harvest_area, o.moisture_pct, o.test_weight,
    o.sowing_date::text AS sowing_date, o.emergence_date::text AS emergence_date, o.heading_date::text AS heading_date,
    o.harvest_date::text AS harvest_date, o.notes
  FROM strips st JOIN sites s ON s.id = st.site_id LEFT JOIN observations o ON o.strip_id = st.id`;

function toStrip(row: Record<string, unknown>): StripRow {
  const observation: ObservationValues | null = row.observed
    ? {
        seedsSown: num(row.seeds_sown),
        standCounts: ((row.stand_counts as number[]) ?? []).map(Number),
        standRowLength: num(row.stand_row_length),
        tillerPlants: num(row.tiller_plants),
        tillerCount: num(row.tiller_count),
        headCounts: ((row.head_counts as number[]) ?? []).map(Number),
        headRowLength: num(row.head_row_length),
        grainWeight: num(row.grain_weight),
        harvestRows: num(row.harvest_rows),
        harvestLength: num(row.harvest_length),
        harvestArea: num(row.harvest_area),
        moisturePct: num(row.moisture_pct),
        testWeight: num(row.test_weight),
        sowingDate: (row.sowing_date as string) ?? null,
        emergenceDate: (row.emergence_date as string) ?? null,
        headingDate: (row.heading_date as string) ?? null,
        harvestDate: (row.harvest_date as string) ?? null,
        notes: (row.notes as string) ?? '',
      }
    : null;
  return {
    id: row.id as string,
    siteId: row.site_id as string,
    block: Number(row.block),
    position: Number(row.position),
    rateLevelId: row.rate_level_id as string,
    observation,
  };
}

interface SnapshotRow {
  id: string;
  data_version: string;
  published_at: Date;
  published_by_name: string | null;
  report?: Record<string, unknown>;
}

const toPublished = (row: SnapshotRow | undefined): PublishedInfo | null =>
  row
    ? {
        snapshotId: row.id,
        publishedAt: new Date(row.published_at).toISOString(),
        publishedBy: row.published_by_name,
        dataVersion: row.data_version,
      }
    : null;

/** A digest of every site's data version and the rate levels: changes when any pooled input changes. */
function pooledDigest(trial: TrialRecord, sites: readonly SiteRow[]): string {
  const parts = [
    ...trial.levels.map((l) => `level:${l.id}:${l.multiplier}`),
    ...sites.map((s) => `site:${s.id}:${s.dataVersion}`),
  ].sort();
  return crypto.createHash('sha256').update(parts.join('\n')).digest('hex').slice(0, 32);
}

/** The caller reads live data when they coordinate the network or grow this site. */
function readsLive(
  access: AccessContext | null,
  networkId: string,
  growerUserId: string | null,
): boolean {
  if (!access) return false;
  return (
    isCoordinating(access.roles.get(networkId)) ||
    (growerUserId !== null && growerUserId === access.userId)
  );
}

const hasQuery = (query: PooledQuery) => Object.values(query).some((v) => v !== undefined);

/** Who is asking, as a cache key: the answer depends on the user and their roles. */
function accessKey(access: AccessContext | null): string {
  if (!access) return 'public';
  let key = access.userId;
  for (const [network, role] of access.roles) key += `|${network}=${role}`;
  return key;
}

export function createReportsService(deps: ReportsServiceDeps) {
  const { dataSource } = deps;
  const siteBodies = createReportCache<Awaited<ReturnType<typeof buildSiteReport>>>();
  const pooledBodies = createReportCache<ReturnType<typeof buildPooledReport>>(100);
  // Whole responses, so that identical requests get the identical object (its JSON is memoised).
  const responses = createReportCache<SiteReport | PooledReport>(300);
  // Published snapshots never change: read each one from PostgreSQL once.
  const snapshots = createReportCache<Record<string, unknown>>(300);
  // Finished answers per caller, until this process next writes anything (see fresh-cache.ts):
  // a repeated report request then costs no query at all.
  const answers = createFreshCache<SiteReport | PooledReport>({ maxEntries: 1000 });
  const storedSnapshot = (id: string) =>
    snapshots.getOrCompute(id, async () => {
      const [row] = await dataSource.query('SELECT report FROM report_snapshots WHERE id = $1', [
        id,
      ]);
      return row.report as Record<string, unknown>;
    });

  async function loadSiteBundle(db: Queryable, siteId: string) {
    const rows = await preparedQuery(
      db,
      `SELECT ${SITE_COLUMNS}, ${TRIAL_COLUMNS},
              snap.id AS snap_id, snap.data_version AS snap_version, snap.published_at AS snap_at, pub.name AS snap_by
         FROM sites s JOIN trials t ON t.id = s.trial_id LEFT JOIN users u ON u.id = s.grower_user_id
         LEFT JOIN LATERAL (SELECT r.id, r.data_version, r.published_at, r.published_by FROM report_snapshots r
                             WHERE r.site_id = s.id AND r.scope = 'site' AND r.withdrawn_at IS NULL
                             ORDER BY r.published_at DESC LIMIT 1) snap ON true
         LEFT JOIN users pub ON pub.id = snap.published_by
        WHERE s.id = $1`,
      [siteId],
    );
    const row = rows[0];
    if (!row) throw new NotFound('Site');
    return {
      row,
      trial: toTrial(row),
      site: toSite(row),
      growerUserId: (row.grower_user_id as string) ?? null,
      growerEmail: ((row.grower_user_email as string) ?? (row.grower_email as string)) || null,
      snapshot: row.snap_id
        ? ({
            id: row.snap_id,
            data_version: row.snap_version,
            published_at: row.snap_at,
            published_by_name: row.snap_by,
          } as SnapshotRow)
        : undefined,
    };
  }

  async function loadStrips(
    db: Queryable,
    where: { siteId: string } | { trialId: string },
  ): Promise<StripRow[]> {
    const [clause, id] =
      'siteId' in where ? ['st.site_id = $1', where.siteId] : ['s.trial_id = $1', where.trialId];
    const rows = await preparedQuery(
      db,
      `${STRIP_SQL} WHERE ${clause} ORDER BY s.id, st.block, st.position`,
      [id],
    );
    return rows.map(toStrip);
  }

  async function loadPhotos(db: Queryable, siteId: string): Promise<ReportPhoto[]> {
    const rows = await preparedQuery<{ id: string; caption: string; strip_id: string | null }>(
      db,
      'SELECT id, caption, strip_id FROM attachments WHERE site_id = $1 ORDER BY created_at',
      [siteId],
    );
    return rows.map((r) => ({
      id: r.id,
      caption: r.caption ?? '',
      stripId: r.strip_id,
      url: `/api/photos/${r.id}`,
    }));
  }

  /** The live site report; pass the photos when the caller has loaded them already. */
  async function liveSiteBody(
    db: Queryable,
    bundle: Awaited<ReturnType<typeof loadSiteBundle>>,
    knownPhotos?: ReportPhoto[],
  ) {
    const [strips, photos] = await Promise.all([
      loadStrips(db, { siteId: bundle.site.id }),
      knownPhotos ?? loadPhotos(db, bundle.site.id),
    ]);
    return buildSiteReport({
      trial: bundle.trial,
      levels: bundle.trial.levels,
      site: bundle.site,
      strips,
      photos,
    });
  }

  function siteReport(siteId: string, access: AccessContext | null): Promise<SiteReport> {
    return answers.get(`site:${siteId}:${accessKey(access)}`, () =>
      computeSiteReport(siteId, access),
    ) as Promise<SiteReport>;
  }

  async function computeSiteReport(
    siteId: string,
    access: AccessContext | null,
  ): Promise<SiteReport> {
    const bundle = await loadSiteBundle(dataSource, siteId);
    const published = toPublished(bundle.snapshot);
    const changed =
      !!bundle.snapshot && bundle.snapshot.data_version !== String(bundle.site.dataVersion);
    const canPublish = !!access && isCoordinating(access.roles.get(bundle.trial.networkId));
    if (!readsLive(access, bundle.trial.networkId, bundle.growerUserId)) {
      if (!bundle.snapshot) throw new Forbidden('This site report is not published yet');
      const stored = (await storedSnapshot(bundle.snapshot.id)) as unknown as SiteReport;
      return {
        ...stored,
        published,
        dataChangedSincePublished: changed,
        fromSnapshot: true,
        canPublish,
      };
    }
    const photos = await loadPhotos(dataSource, bundle.site.id);
    const bodyKey = digestOf('site', bundle.trial, bundle.site, photos);
    const body = await siteBodies.getOrCompute(bodyKey, () =>
      liveSiteBody(dataSource, bundle, photos),
    );
    const key = digestOf('site-response', bodyKey, published, changed, canPublish);
    return (await responses.getOrCompute(key, async () => ({
      ...body,
      published,
      dataChangedSincePublished: changed,
      fromSnapshot: false,
      canPublish,
    }))) as SiteReport;
  }

  async function loadTrialBundle(db: Queryable, trialId: string) {
    const [trialRows, siteRows, snapshots] = await Promise.all([
      preparedQuery(db, `SELECT ${TRIAL_COLUMNS} FROM trials t WHERE t.id = $1`, [trialId]),
      preparedQuery(
        db,
        `SELECT ${SITE_COLUMNS} FROM sites s LEFT JOIN users u ON u.id = s.grower_user_id WHERE s.trial_id = $1 ORDER BY s.created_at, s.field_name`,
        [trialId],
      ),
      preparedQuery<SnapshotRow>(
        db,
        `SELECT r.id, r.data_version, r.published_at, u.name AS published_by_name FROM report_snapshots r
           LEFT JOIN users u ON u.id = r.published_by
          WHERE r.trial_id = $1 AND r.scope = 'pooled' AND r.withdrawn_at IS NULL ORDER BY r.published_at DESC LIMIT 1`,
        [trialId],
      ),
    ]);
    if (!trialRows[0]) throw new NotFound('Trial');
    const trial = toTrial(trialRows[0]);
    const sites = siteRows.map(toSite);
    return { trial, sites, snapshot: snapshots[0], digest: pooledDigest(trial, sites) };
  }

  async function livePooledInput(
    db: Queryable,
    bundle: Awaited<ReturnType<typeof loadTrialBundle>>,
  ): Promise<PooledInput> {
    const strips = await loadStrips(db, { trialId: bundle.trial.id });
    return pooledInput(bundle.trial, bundle.trial.levels, bundle.sites, strips);
  }

  async function storedPooled(
    snapshotId: string,
  ): Promise<{ report: PooledReport; input: PooledInput }> {
    return (await storedSnapshot(snapshotId)) as unknown as {
      report: PooledReport;
      input: PooledInput;
    };
  }

  function pooledReport(
    trialId: string,
    access: AccessContext | null,
    query: PooledQuery,
  ): Promise<PooledReport> {
    const key = `pooled:${trialId}:${accessKey(access)}:${JSON.stringify(query)}`;
    return answers.get(key, () =>
      computePooledReport(trialId, access, query),
    ) as Promise<PooledReport>;
  }

  async function computePooledReport(
    trialId: string,
    access: AccessContext | null,
    query: PooledQuery,
  ): Promise<PooledReport> {
    const bundle = await loadTrialBundle(dataSource, trialId);
    const published = toPublished(bundle.snapshot);
    const changed = !!bundle.snapshot && bundle.snapshot.data_version !== bundle.digest;
    const coordinating = !!access && isCoordinating(access.roles.get(bundle.trial.networkId));
    if (!coordinating) {
      if (!bundle.snapshot) throw new Forbidden('The pooled report is not published yet');
      const stored = await storedPooled(bundle.snapshot.id);
      const key = digestOf('pooled-published', bundle.snapshot.id, query, published, changed);
      return (await responses.getOrCompute(key, async () => {
        const body = hasQuery(query) ? buildPooledReport(stored.input, query) : stored.report;
        return {
          ...body,
          published,
          dataChangedSincePublished: changed,
          fromSnapshot: true,
          canPublish: false,
          publicLinkToken: null,
        };
      })) as PooledReport;
    }
    const bodyKey = digestOf('pooled', bundle.trial, bundle.sites, query);
    const body = await pooledBodies.getOrCompute(bodyKey, async () =>
      buildPooledReport(await livePooledInput(dataSource, bundle), query),
    );
    const key = digestOf('pooled-response', bodyKey, published, changed);
    return (await responses.getOrCompute(key, async () => ({
      ...body,
      published,
      dataChangedSincePublished: changed,
      fromSnapshot: false,
      canPublish: true,
      publicLinkToken: bundle.trial.publicLinkToken,
    }))) as PooledReport;
  }

  async function publicReport(token: string, query: PooledQuery): Promise<PooledReport> {
    const rows: { id: string }[] = await dataSource.query(
      'SELECT id FROM trials WHERE public_link_token = $1',
      [token],
    );
    if (!rows[0]) throw new NotFound('Report');
    try {
      return await pooledReport(rows[0].id, null, query);
    } catch (error) {
      if (error instanceof Forbidden) throw new NotFound('Report');
      throw error;
    }
  }

  async function publishSite(
    siteId: string,
    actorUserId: string,
  ): Promise<{ report: SiteReport; mailed: boolean }> {
    const result = await dataSource.transaction(async (manager) => {
      await manager.query('SELECT id FROM sites WHERE id = $1 FOR UPDATE', [siteId]);
      const bundle = await loadSiteBundle(manager, siteId);
      const body = await liveSiteBody(manager, bundle);
      if (!body.analysis)
        throw new Conflict(
          `This site cannot be published yet: ${body.analysisError ?? 'no analysis'}`,
        );
      await manager.query(
        `UPDATE report_snapshots SET withdrawn_at = now() WHERE site_id = $1 AND scope = 'site' AND withdrawn_at IS NULL`,
        [siteId],
      );
      const [snapshot] = await manager.query(
        `INSERT INTO report_snapshots (scope, trial_id, site_id, data_version, report, published_by)
         VALUES ('site', $1, $2, $3, $4, $5) RETURNING id`,
        [
          bundle.trial.id,
          siteId,
          String(bundle.site.dataVersion),
          JSON.stringify(body),
          actorUserId,
        ],
      );
      await manager.query('UPDATE sites SET published_at = now() WHERE id = $1', [siteId]);
      await recordAudit(manager, {
        actorUserId,
        entityType: 'site',
        entityId: siteId,
        siteId,
        action: 'report.publish',
        after: { snapshotId: snapshot.id, dataVersion: bundle.site.dataVersion },
      });
      return { bundle };
    });
    const { bundle } = result;
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
    return {
      report: await siteReport(siteId, {
        userId: actorUserId,
        roles: new Map([[bundle.trial.networkId, 'coordinator']]),
      }),
      mailed,
    };
  }

  async function unpublishSite(siteId: string, actorUserId: string): Promise<SiteReport> {
    const networkId = await dataSource.transaction(async (manager) => {
      const rows: { network_id: string }[] = await manager.query(
        'SELECT t.network_id FROM sites s JOIN trials t ON t.id = s.trial_id WHERE s.id = $1 FOR UPDATE OF s',
        [siteId],
      );
      if (!rows[0]) throw new NotFound('Site');
      const withdrawn = await manager.query(
        `UPDATE report_snapshots SET withdrawn_at = now() WHERE site_id = $1 AND scope = 'site' AND withdrawn_at IS NULL RETURNING id`,
        [siteId],
      );
      await manager.query('UPDATE sites SET published_at = NULL WHERE id = $1', [siteId]);
      await recordAudit(manager, {
        actorUserId,
        entityType: 'site',
        entityId: siteId,
        siteId,
        action: 'report.unpublish',
        before: {
          snapshotIds: (withdrawn[0] as { id: string }[] | undefined)?.map((r) => r.id) ?? [],
        },
      });
      return rows[0].network_id;
    });
    return siteReport(siteId, {
      userId: actorUserId,
      roles: new Map([[networkId, 'coordinator']]),
    });
  }

  async function publishTrial(trialId: string, actorUserId: string): Promise<PooledReport> {
    const networkId = await dataSource.transaction(async (manager) => {
      await manager.query('SELECT id FROM trials WHERE id = $1 FOR UPDATE', [trialId]);
      const bundle = await loadTrialBundle(manager, trialId);
      const input = await livePooledInput(manager, bundle);
      const report = buildPooledReport(input, {});
      if (!report.analysis)
        throw new Conflict(
          `The pooled report cannot be published yet: ${report.analysisError ?? 'no analysis'}`,
        );
      await manager.query(
        `UPDATE report_snapshots SET withdrawn_at = now() WHERE trial_id = $1 AND scope = 'pooled' AND withdrawn_at IS NULL`,
        [trialId],
      );
      const [snapshot] = await manager.query(
        `INSERT INTO report_snapshots (scope, trial_id, site_id, data_version, report, published_by)
         VALUES ('pooled', $1, NULL, $2, $3, $4) RETURNING id`,
        [trialId, bundle.digest, JSON.stringify({ report, input }), actorUserId],
      );
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
    return pooledReport(
      trialId,
      { userId: actorUserId, roles: new Map([[networkId, 'coordinator']]) },
      {},
    );
  }

  async function unpublishTrial(trialId: string, actorUserId: string): Promise<PooledReport> {
    const networkId = await dataSource.transaction(async (manager) => {
      const rows: { network_id: string }[] = await manager.query(
        'SELECT network_id FROM trials WHERE id = $1 FOR UPDATE',
        [trialId],
      );
      if (!rows[0]) throw new NotFound('Trial');
      await manager.query(
        `UPDATE report_snapshots SET withdrawn_at = now() WHERE trial_id = $1 AND scope = 'pooled' AND withdrawn_at IS NULL`,
        [trialId],
      );
      // A withdrawn report must not stay reachable from a link handed out earlier.
      await manager.query('UPDATE trials SET public_link_token = NULL WHERE id = $1', [trialId]);
      await recordAudit(manager, {
        actorUserId,
        entityType: 'trial',
        entityId: trialId,
        action: 'report.unpublish',
      });
      return rows[0].network_id;
    });
    return pooledReport(
      trialId,
      { userId: actorUserId, roles: new Map([[networkId, 'coordinator']]) },
      {},
    );
  }

  async function setPublicLink(
    trialId: string,
    enabled: boolean,
    actorUserId: string,
  ): Promise<{ token: string | null }> {
    return dataSource.transaction(async (manager) => {
      const rows: { public_link_token: string | null }[] = await manager.query(
        'SELECT public_link_token FROM trials WHERE id = $1 FOR UPDATE',
        [trialId],
      );
      if (!rows[0]) throw new NotFound('Trial');
      if (!enabled) {
        await manager.query('UPDATE trials SET public_link_token = NULL WHERE id = $1', [trialId]);
        await recordAudit(manager, {
          actorUserId,
          entityType: 'trial',
          entityId: trialId,
          action: 'report.public-link.off',
        });
        return { token: null };
      }
      if (rows[0].public_link_token) return { token: rows[0].public_link_token };
      const published = await manager.query(
        `SELECT 1 FROM report_snapshots WHERE trial_id = $1 AND scope = 'pooled' AND withdrawn_at IS NULL LIMIT 1`,
        [trialId],
      );
      if (published.length === 0)
        throw new Conflict('Publish the pooled report before sharing a public link');
      const token = crypto.randomBytes(24).toString('base64url');
      await manager.query('UPDATE trials SET public_link_token = $2 WHERE id = $1', [
        trialId,
        token,
      ]);
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
    const bundle = await loadTrialBundle(dataSource, trialId);
    const strips = await loadStrips(dataSource, { trialId });
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
