// Strip data for collection: list a site's strips, and change one strip under optimistic locking.
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/schemas/common';
import { ObservationValuesSchema } from '../../shared/schemas/observation';
import type { SiteStrips, StripDto, UpdateStripInput } from '../../shared/schemas/strip';
import { recordAudit } from '../audit/audit.service';
import { Conflict } from '../errors';
import {
  bumpDataVersion,
  changedFields,
  loadSite,
  loadSiteStrips,
  loadStrip,
  lockSiteForChange,
  writeObservation,
} from '../lib/strip-data';
import { isCoordinating } from '../middleware/access';
import { presentSite, presentStrips } from '../lib/strip-presenter';

export interface Caller {
  userId: string;
  roles: Map<string, Role>;
}

export function createStripsService(deps: { dataSource: DataSource }) {
  const { dataSource } = deps;

  async function present(stripId: string, siteId: string): Promise<StripDto> {
    const manager = dataSource.manager;
    const site = await loadSite(manager, siteId);
    const all = await loadSiteStrips(manager, siteId);
    return presentStrips(site, all.filter((s) => s.stripId === stripId), all)[0]!;
  }

  return {
    async listSiteStrips(siteId: string, caller: Caller): Promise<SiteStrips> {
      const manager = dataSource.manager;
      const site = await loadSite(manager, siteId);
      const strips = await loadSiteStrips(manager, siteId);
      const coordinating = isCoordinating(caller.roles.get(site.networkId));
      return {
        site: presentSite(site, { canEdit: coordinating || site.growerUserId === caller.userId, isCoordinator: coordinating }),
        strips: presentStrips(site, strips),
      };
    },

    async getStrip(stripId: string): Promise<StripDto> {
      const strip = await loadStrip(dataSource.manager, stripId);
      return present(stripId, strip.siteId);
    },

    /**
     * Applies a partial update made on `input.version`. A stale version gets 409 with the
     * current strip, unless the values sent are already stored (a retried send); equal values
     * change nothing and keep the version.
     */
    async updateStrip(stripId: string, input: UpdateStripInput, actorUserId: string): Promise<StripDto> {
      const { siteId } = await loadStrip(dataSource.manager, stripId);
      const outcome = await dataSource.transaction(async (manager) => {
        const site = await lockSiteForChange(manager, siteId);
        const current = await loadStrip(manager, stripId);
        const merged = ObservationValuesSchema.parse({ ...current.values, ...input.values });
        const diff = changedFields(current.values, merged);
        if (!diff) return { changed: false as const };
        const updated: unknown[] = await manager.query(
          // The CTE makes the driver return the updated rows; none means the version was stale.
          'WITH bumped AS (UPDATE strips SET version = version + 1 WHERE id = $1 AND version = $2 RETURNING version) SELECT version FROM bumped',
          [stripId, input.version],
        );
        if (updated.length === 0) return { changed: false as const, stale: true as const };
        await writeObservation(manager, stripId, merged, actorUserId);
        await recordAudit(manager, {
          actorUserId,
          entityType: 'strip',
          entityId: stripId,
          siteId: site.siteId,
          action: 'update',
          before: diff.before,
          after: diff.after,
        });
        await bumpDataVersion(manager, site.siteId);
        return { changed: true as const };
      });
      const strip = await present(stripId, siteId);
      if ('stale' in outcome) {
        throw new Conflict(
          `Someone saved this strip after you opened it (now version ${strip.version}). Reload their values, or save yours over them.`,
          strip,
        );
      }
      return strip;
    },
  };
}

export type StripsService = ReturnType<typeof createStripsService>;
