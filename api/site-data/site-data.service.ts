// Site-level collection data: dates that apply to every strip, the site's notes, and the history
// of changes a coordinator reads.
import { In, type DataSource } from 'typeorm';
import { AuditEvent } from '../../db/entities/audit-event.entity';
import { Site } from '../../db/entities/site.entity';
import { Strip } from '../../db/entities/strip.entity';
import type { Role } from '../../shared/schemas/common';
import type { AuditEventDto, SiteContext, UpdateSiteDataInput } from '../../shared/schemas/strip';
import { recordAudit } from '../audit/audit.service';
import { bumpDataVersion, loadSite, lockSiteForChange } from '../lib/strip-data';
import { isCoordinating } from '../middleware/access';
import { presentSite } from '../lib/strip-presenter';

/** The site fields a grower or coordinator edits here. */
const FIELDS = ['sowingDate', 'emergenceDate', 'headingDate', 'harvestDate', 'notes'] as const;

type StripPlace = NonNullable<AuditEventDto['strip']>;

function toAuditEventDto(event: AuditEvent, strip: StripPlace | undefined): AuditEventDto {
  return {
    id: event.id,
    createdAt: event.createdAt.toISOString(),
    actorName: event.actor?.name ?? null,
    actorEmail: event.actor?.email ?? null,
    entityType: event.entityType,
    entityId: event.entityId,
    action: event.action,
    strip: strip ?? null,
    before: event.before ?? null,
    after: event.after ?? null,
  };
}

export function createSiteDataService(deps: { dataSource: DataSource }) {
  const { dataSource } = deps;
  return {
    async updateSite(
      siteId: string,
      input: UpdateSiteDataInput,
      caller: { userId: string; roles: Map<string, Role> },
    ): Promise<SiteContext> {
      await dataSource.transaction(async (manager) => {
        const site = await lockSiteForChange(manager, siteId);
        const before: Record<string, unknown> = {};
        const after: Record<string, unknown> = {};
        const changes: Partial<Pick<Site, (typeof FIELDS)[number]>> = {};
        for (const key of FIELDS) {
          const value = input[key];
          if (value === undefined || value === site[key]) continue;
          before[key] = site[key];
          after[key] = value;
          Object.assign(changes, { [key]: value });
        }
        if (Object.keys(changes).length === 0) return;
        await manager.getRepository(Site).update(siteId, changes);
        await recordAudit(manager, {
          actorUserId: caller.userId,
          entityType: 'site',
          entityId: siteId,
          siteId,
          action: 'update',
          before,
          after,
        });
        await bumpDataVersion(manager, siteId);
      });
      const site = await loadSite(dataSource.manager, siteId);
      const coordinating = isCoordinating(caller.roles.get(site.networkId));
      return presentSite(site, {
        canEdit: coordinating || site.growerUserId === caller.userId,
        isCoordinator: coordinating,
      });
    },

    async listAudit(siteId: string): Promise<AuditEventDto[]> {
      const events = await dataSource
        .getRepository(AuditEvent)
        .createQueryBuilder('event')
        .leftJoin('event.actor', 'actor')
        .addSelect(['actor.id', 'actor.name', 'actor.email'])
        .where('event.siteId = :siteId', { siteId })
        .orderBy('event.createdAt', 'DESC')
        .addOrderBy('event.id', 'ASC')
        .limit(500)
        .getMany();
      const stripIds = events.filter((e) => e.entityType === 'strip').map((e) => e.entityId);
      const strips =
        stripIds.length === 0
          ? []
          : await dataSource.getRepository(Strip).find({
              select: {
                id: true,
                block: true,
                position: true,
                rateLevel: { id: true, label: true },
              },
              relations: { rateLevel: true },
              where: { id: In([...new Set(stripIds)]) },
            });
      const places = new Map(
        strips.map((s) => [
          s.id,
          { block: s.block, position: s.position, label: String(s.rateLevel?.label) },
        ]),
      );
      return events.map((event) =>
        toAuditEventDto(
          event,
          event.entityType === 'strip' ? places.get(event.entityId) : undefined,
        ),
      );
    },
  };
}
