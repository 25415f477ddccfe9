// Strip data for collection: list a site's strips, and change one strip under optimistic locking.
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/schemas/common';
import { ObservationValuesSchema } from '../../shared/schemas/observation';
import type { SiteStrips, StripDto, UpdateStripInput } from '../../shared/schemas/strip';
import { Conflict, NotFound } from '../errors';
import {
  changedFields,
  changeStrip,
  loadSite,
  loadSiteStrips,
  publishedSiteLocked,
  type SiteKey,
  type StripRecord,
} from '../lib/strip-data';
import { isCoordinating } from '../middleware/access';
import { presentSite, presentStrips } from '../lib/strip-presenter';

export interface Caller {
  userId: string;
  roles: Map<string, Role>;
}

export function createStripsService(deps: { dataSource: DataSource }) {
  const { dataSource } = deps;

  /** The site and all its strips: the outlier warning of one strip looks at the whole site. */
  async function loadWholeSite(key: SiteKey) {
    const [site, strips] = await Promise.all([
      loadSite(dataSource.manager, key),
      loadSiteStrips(dataSource.manager, key),
    ]);
    return { site, strips };
  }

  function presentOne(whole: Awaited<ReturnType<typeof loadWholeSite>>, stripId: string): StripDto {
    const strip = whole.strips.find((s) => s.stripId === stripId);
    if (!strip) throw new NotFound('Strip');
    return presentStrips(whole.site, [strip], whole.strips)[0]!;
  }

  return {
    async listSiteStrips(siteId: string, caller: Caller): Promise<SiteStrips> {
      const { site, strips } = await loadWholeSite(siteId);
      const coordinating = isCoordinating(caller.roles.get(site.networkId));
      return {
        site: presentSite(site, {
          canEdit: coordinating || site.growerUserId === caller.userId,
          isCoordinator: coordinating,
        }),
        strips: presentStrips(site, strips),
      };
    },

    async getStrip(stripId: string): Promise<StripDto> {
      return presentOne(await loadWholeSite({ stripId }), stripId);
    },

    /**
     * Applies a partial update made on `input.version`. A stale version gets 409 with the
     * current strip, unless the values sent are already stored (a retried send); equal values
     * change nothing and keep the version. Two reads side by side, then one statement that
     * writes only if the strip is still at the version read (see changeStrip).
     */
    async updateStrip(
      stripId: string,
      input: UpdateStripInput,
      actorUserId: string,
    ): Promise<StripDto> {
      const whole = await loadWholeSite({ stripId });
      const current = whole.strips.find((s) => s.stripId === stripId);
      if (!current) throw new NotFound('Strip');
      // Checked again, under the row lock, by the statement that writes.
      if (whole.site.publishedAt) throw publishedSiteLocked();
      const merged = ObservationValuesSchema.parse({ ...current.values, ...input.values });
      const diff = changedFields(current.values, merged);
      if (!diff) return presentOne(whole, stripId);
      const outcome = await changeStrip(dataSource.manager, {
        siteId: whole.site.siteId,
        stripId,
        version: input.version,
        values: merged,
        actorUserId,
        before: diff.before,
        after: diff.after,
      });
      if (outcome.kind === 'published') throw publishedSiteLocked();
      if (outcome.kind === 'stale') {
        const fresh = presentOne(await loadWholeSite({ stripId }), stripId);
        throw new Conflict(
          `Someone saved this strip after you opened it (now version ${fresh.version}). Reload their values, or save yours over them.`,
          fresh,
        );
      }
      const saved: StripRecord = {
        ...current,
        values: merged,
        version: outcome.version,
        hasObservation: true,
        updatedAt: outcome.updatedAt,
      };
      return presentOne(
        { ...whole, strips: whole.strips.map((s) => (s.stripId === stripId ? saved : s)) },
        stripId,
      );
    },
  };
}

export type StripsService = ReturnType<typeof createStripsService>;
