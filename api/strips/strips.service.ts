// Strip data for collection: list a site's strips, and change one strip under optimistic locking.
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/schemas/common';
import { ObservationValuesSchema } from '../../shared/schemas/observation';
import type { SiteStrips, StripDto, UpdateStripInput } from '../../shared/schemas/strip';
import { Conflict, NotFound } from '../errors';
import {
  advanceStripVersion,
  changedFields,
  loadSite,
  loadSiteStrips,
  patchAlreadyApplied,
  assertSiteOpen,
  writeStripChange,
  type StripRecord,
} from '../lib/strip-data';
import { growsSite, isCoordinating } from '../middleware/access';
import { presentSite, presentStrips } from '../lib/strip-presenter';

export interface Caller {
  userId: string;
  roles: Map<string, Role>;
}

export function createStripsService(deps: { dataSource: DataSource }) {
  const { dataSource } = deps;

  /** The site and all its strips: the outlier warning of one strip looks at the whole site. */
  async function loadWholeSite(siteId: string) {
    const [site, strips] = await Promise.all([
      loadSite(dataSource.manager, siteId),
      loadSiteStrips(dataSource.manager, siteId),
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
      const role = caller.roles.get(site.networkId);
      const coordinating = isCoordinating(role);
      return {
        site: presentSite(site, {
          canEdit:
            site.trialStatus !== 'closed' &&
            (coordinating || growsSite(role, site.growerUserId, caller.userId)),
          isCoordinator: coordinating,
        }),
        strips: presentStrips(site, strips),
      };
    },

    async getStrip(change: { stripId: string; siteId: string }): Promise<StripDto> {
      return presentOne(await loadWholeSite(change.siteId), change.stripId);
    },

    /**
     * Applies a partial update made on `input.version`, in one transaction: lock the site row,
     * refuse a published site (423), read the site's strips and check this strip's version (409
     * with the current strip, unless the values sent are already stored: a retried send), then
     * write the observation, its audit event and the site's data_version. Equal values change
     * nothing. The answer is built from what the transaction read and wrote: with the site row
     * locked, nothing else changed the site's strips meanwhile.
     */
    async updateStrip(
      change: { stripId: string; siteId: string },
      input: UpdateStripInput,
      actorUserId: string,
    ): Promise<StripDto> {
      const { stripId, siteId } = change;
      const { outcome, whole } = await dataSource.transaction(async (manager) => {
        const site = await loadSite(manager, siteId, { lock: true });
        assertSiteOpen(site);
        const strips = await loadSiteStrips(manager, siteId);
        const current = strips.find((strip) => strip.stripId === stripId);
        if (!current) throw new NotFound('Strip');
        const answer = (outcome: 'saved' | 'stale' | 'unchanged', now = strips) => ({
          outcome,
          whole: { site, strips: now },
        });
        if (current.version !== input.version) {
          return answer(patchAlreadyApplied(current.values, input.values) ? 'unchanged' : 'stale');
        }
        const merged = ObservationValuesSchema.parse({ ...current.values, ...input.values });
        const diff = changedFields(current.values, merged);
        if (!diff) return answer('unchanged');
        if (!(await advanceStripVersion(manager, stripId, current.version))) {
          throw new Error(`strip ${stripId} changed under its site's lock`);
        }
        const { updatedAt } = await writeStripChange(manager, {
          siteId,
          stripId,
          values: merged,
          actorUserId,
          before: diff.before,
          after: diff.after,
        });
        const saved: StripRecord = {
          ...current,
          values: merged,
          version: current.version + 1,
          hasObservation: true,
          updatedAt,
        };
        return answer(
          'saved',
          strips.map((strip) => (strip.stripId === stripId ? saved : strip)),
        );
      });
      const fresh = presentOne(whole, stripId);
      if (outcome === 'stale') {
        throw new Conflict(
          `Someone saved this strip after you opened it (now version ${fresh.version}). Reload their values, or save yours over them.`,
          fresh,
        );
      }
      return fresh;
    },
  };
}

export type StripsService = ReturnType<typeof createStripsService>;
