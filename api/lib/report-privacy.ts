// What readers who do not coordinate a network may see of its growers: field names only where
// the grower agreed (otherwise "Farm C"), and never e-mail addresses, fertility or notes.
import crypto from 'node:crypto';
import type { DataSource } from 'typeorm';
import type { PooledReport, SiteReport } from '../../shared/schemas/report';
import type { SiteDetail } from '../../shared/schemas/site';
import { Site } from '../../db/entities/site.entity';
import { isCoordinating, type AccessContext } from '../middleware/access';
import {
  renameEverywhere,
  seesPrivateDetails,
  siteNameFor,
  type NamedSite,
  type Viewer,
} from './site-names';

interface TrialNaming {
  networkId: string;
  sites: (NamedSite & { id: string })[];
}

/** A short digest of what a viewer may see of the farms' names, for the ETag. */
function viewDigest(view: string): string {
  return crypto.createHash('sha256').update(view).digest('hex').slice(0, 16);
}

function viewerOf(access: AccessContext | null | undefined, networkId: string): Viewer {
  return { userId: access?.userId ?? null, role: access?.roles.get(networkId) };
}

/** Every unnamed site's field name → its label, for the sites this viewer may not see named. */
function renames(naming: TrialNaming, viewer: Viewer): Map<string, string> {
  const map = new Map<string, string>();
  for (const site of naming.sites) {
    const shown = siteNameFor(site, viewer);
    if (shown !== site.fieldName) map.set(site.fieldName, shown);
  }
  return map;
}

export function createReportPrivacy(dataSource: DataSource) {
  /** The trial's sites with their naming choices, in one query; null when it has no site. */
  async function naming(trialId: string): Promise<TrialNaming | null> {
    const sites = await dataSource
      .getRepository(Site)
      .createQueryBuilder('site')
      .innerJoin('site.trial', 'trial')
      .select([
        'site.id',
        'site.fieldName',
        'site.growerUserId',
        'site.namedInReports',
        'site.reportNumber',
        'trial.id',
        'trial.networkId',
      ])
      .where('site.trialId = :trialId', { trialId })
      .getMany();
    const [first] = sites;
    if (!first) return null;
    return { networkId: first.trial!.networkId, sites };
  }

  async function siteReport(
    report: SiteReport,
    access: AccessContext | null | undefined,
    known?: TrialNaming | null,
  ): Promise<SiteReport> {
    const trialNaming = known === undefined ? await naming(report.site.trialId) : known;
    if (!trialNaming) return report;
    const viewer = viewerOf(access, trialNaming.networkId);
    const site = trialNaming.sites.find((s) => s.id === report.site.id);
    if (!site || seesPrivateDetails(site, viewer)) return report;
    const renamed = renameEverywhere(report, renames(trialNaming, viewer));
    return {
      ...renamed,
      site: {
        ...renamed.site,
        growerName: site.namedInReports ? report.site.growerName : null,
        fertility: '',
        notes: '',
      },
      strips: renamed.strips.map((s) => ({ ...s, notes: '' })),
    };
  }

  async function pooledReport(
    report: PooledReport,
    access: AccessContext | null | undefined,
    known?: TrialNaming | null,
  ): Promise<PooledReport> {
    const trialNaming = known === undefined ? await naming(report.trial.id) : known;
    if (!trialNaming) return report;
    const viewer = viewerOf(access, trialNaming.networkId);
    const map = renames(trialNaming, viewer);
    return map.size === 0 ? report : renameEverywhere(report, map);
  }

  async function siteDetail(
    detail: SiteDetail,
    access: AccessContext | null | undefined,
  ): Promise<SiteDetail> {
    const viewer = viewerOf(access, detail.networkId);
    const site = { growerUserId: detail.grower.userId };
    if (seesPrivateDetails(site, viewer)) return detail;
    return {
      ...detail,
      fieldName: detail.namedInReports ? detail.fieldName : detail.reportLabel,
      fertility: '',
      notes: '',
      grower: {
        userId: null,
        name: detail.namedInReports ? detail.grower.name : null,
        email: null,
        invitationPending: false,
      },
      calibrations: [],
    };
  }

  /**
   * The same for a report sent with an ETag: the tag also names what the viewer may see of
   * the farms, so a grower's naming change never leaves a stale 304 behind.
   */
  async function tagged<T extends SiteReport | PooledReport>(
    input: { etag: string; report: T },
    access: AccessContext | null | undefined,
    networkId?: string,
  ): Promise<{ etag: string; report: T }> {
    // A coordinator of the network sees every farm by its name: nothing to read or rename.
    if (networkId && isCoordinating(access?.roles.get(networkId)))
      return { etag: `${input.etag}-${viewDigest('[]')}`, report: input.report };
    const trialId = 'site' in input.report ? input.report.site.trialId : input.report.trial.id;
    const trialNaming = await naming(trialId);
    const view = trialNaming
      ? JSON.stringify([...renames(trialNaming, viewerOf(access, trialNaming.networkId))])
      : '';
    const report = (
      'site' in input.report
        ? await siteReport(input.report, access, trialNaming)
        : await pooledReport(input.report as PooledReport, access, trialNaming)
    ) as T;
    return { etag: `${input.etag}-${viewDigest(view)}`, report };
  }

  return { siteReport, pooledReport, siteDetail, naming, tagged };
}
