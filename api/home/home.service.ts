// What a signed-in person sees first: the trials they can read and the sites they grow.
import type { DataSource } from 'typeorm';
import { Membership } from '../../db/entities/membership.entity';
import { ReportSnapshot } from '../../db/entities/report-snapshot.entity';
import { Site } from '../../db/entities/site.entity';
import { Strip } from '../../db/entities/strip.entity';
import { Trial } from '../../db/entities/trial.entity';
import type { SiteSummary } from '../../shared/schemas/site';
import type { TrialSummary } from '../../shared/schemas/trial';

const COORDINATING_ROLES = ['admin', 'coordinator'];

function toTrialSummary(trial: Trial, siteCount: number): TrialSummary {
  return {
    id: trial.id,
    networkId: trial.networkId,
    networkName: trial.network!.name,
    name: trial.name,
    crop: trial.crop,
    season: trial.season,
    status: trial.status,
    siteCount,
  };
}

function toSiteSummary(
  site: Site,
  counts: { strips: number; withYield: number } | undefined,
): SiteSummary {
  const trial = site.trial!;
  return {
    id: site.id,
    trialId: site.trialId,
    trialName: trial.name,
    crop: trial.crop,
    season: trial.season,
    fieldName: site.fieldName,
    growerName: site.grower?.name ?? null,
    growerEmail: site.grower?.email ?? site.growerEmail,
    randomized: site.randomizedAt !== null,
    stripCount: counts?.strips ?? 0,
    stripsWithYield: counts?.withYield ?? 0,
    publishedAt: site.publishedAt?.toISOString() ?? null,
  };
}

export function createHomeService(dataSource: DataSource) {
  /** How many sites each trial has. */
  async function siteCounts(trialIds: string[]): Promise<Map<string, number>> {
    if (trialIds.length === 0) return new Map();
    const rows: { trialId: string; sites: string }[] = await dataSource
      .getRepository(Site)
      .createQueryBuilder('site')
      .select('site.trialId', 'trialId')
      .addSelect('COUNT(*)', 'sites')
      .where('site.trialId IN (:...trialIds)', { trialIds })
      .groupBy('site.trialId')
      .getRawMany();
    return new Map(rows.map((r) => [r.trialId, Number(r.sites)]));
  }

  /** How many strips each site has, and how many of them have a grain weight. */
  async function stripCounts(
    siteIds: string[],
  ): Promise<Map<string, { strips: number; withYield: number }>> {
    if (siteIds.length === 0) return new Map();
    const rows: { siteId: string; strips: string; withYield: string }[] = await dataSource
      .getRepository(Strip)
      .createQueryBuilder('strip')
      .leftJoin('strip.observation', 'observation')
      .select('strip.siteId', 'siteId')
      .addSelect('COUNT(*)', 'strips')
      .addSelect('COUNT(observation.grainWeight)', 'withYield')
      .where('strip.siteId IN (:...siteIds)', { siteIds })
      .groupBy('strip.siteId')
      .getRawMany();
    return new Map(
      rows.map((r) => [r.siteId, { strips: Number(r.strips), withYield: Number(r.withYield) }]),
    );
  }

  /** Coordinators and admins see all their networks' trials; growers their own; members published ones. */
  async function listTrials(userId: string): Promise<TrialSummary[]> {
    const growsASite = dataSource
      .getRepository(Site)
      .createQueryBuilder('grown')
      .select('1')
      .where('grown.trialId = trial.id')
      .andWhere('grown.growerUserId = :userId', { userId });
    const hasPublished = dataSource
      .getRepository(ReportSnapshot)
      .createQueryBuilder('snapshot')
      .select('1')
      .where('snapshot.trialId = trial.id')
      .andWhere('snapshot.withdrawnAt IS NULL');
    const trials = await dataSource
      .getRepository(Trial)
      .createQueryBuilder('trial')
      .innerJoinAndSelect('trial.network', 'network')
      .innerJoin(
        Membership,
        'membership',
        'membership.networkId = trial.networkId AND membership.userId = :userId',
        { userId },
      )
      .where('membership.role IN (:...roles)', { roles: COORDINATING_ROLES })
      .orWhereExists(growsASite)
      .orWhereExists(hasPublished)
      .orderBy('trial.season', 'DESC', 'NULLS LAST')
      .addOrderBy('trial.createdAt', 'DESC')
      .getMany();
    const counts = await siteCounts(trials.map((t) => t.id));
    return trials.map((trial) => toTrialSummary(trial, counts.get(trial.id) ?? 0));
  }

  async function listMySites(userId: string): Promise<SiteSummary[]> {
    const sites = await dataSource
      .getRepository(Site)
      .createQueryBuilder('site')
      .innerJoinAndSelect('site.trial', 'trial')
      .leftJoin('site.grower', 'grower')
      .addSelect(['grower.id', 'grower.name', 'grower.email'])
      .where('site.growerUserId = :userId', { userId })
      .orderBy('trial.season', 'DESC', 'NULLS LAST')
      .addOrderBy('trial.name', 'ASC')
      .addOrderBy('site.fieldName', 'ASC')
      .getMany();
    const counts = await stripCounts(sites.map((s) => s.id));
    return sites.map((site) => toSiteSummary(site, counts.get(site.id)));
  }

  return { listTrials, listMySites };
}
