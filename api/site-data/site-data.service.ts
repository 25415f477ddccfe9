// Site-level collection data: dates that apply to every strip, the site's notes, and the history
// of changes a coordinator reads.
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/schemas/common';
import type { AuditEventDto, SiteContext, UpdateSiteDataInput } from '../../shared/schemas/strip';
import { recordAudit } from '../audit/audit.service';
import { bumpDataVersion, loadSite, lockSiteForChange } from '../lib/strip-data';
import { isCoordinating } from '../middleware/access';
import { presentSite } from '../lib/strip-presenter';

const COLUMNS = {
  sowingDate: 'sowing_date',
  emergenceDate: 'emergence_date',
  headingDate: 'heading_date',
  harvestDate: 'harvest_date',
  notes: 'notes',
} as const;

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
        const sets: string[] = [];
        const params: unknown[] = [siteId];
        for (const [key, column] of Object.entries(COLUMNS) as [keyof typeof COLUMNS, string][]) {
          const value = input[key];
          if (value === undefined || value === site[key]) continue;
          before[key] = site[key];
          after[key] = value;
          params.push(value);
          sets.push(`${column} = $${params.length}`);
        }
        if (sets.length === 0) return;
        await manager.query(`UPDATE sites SET ${sets.join(', ')} WHERE id = $1`, params);
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
      const rows = await dataSource.query(
        `SELECT a.id, a.created_at, a.entity_type, a.entity_id, a.action, a.before, a.after,
                u.name AS actor_name, u.email AS actor_email, st.block, st.position, rl.label
           FROM audit_events a
           LEFT JOIN users u ON u.id = a.actor_user_id
           LEFT JOIN strips st ON a.entity_type = 'strip' AND st.id = a.entity_id
           LEFT JOIN rate_levels rl ON rl.id = st.rate_level_id
          WHERE a.site_id = $1
          ORDER BY a.created_at DESC, a.id
          LIMIT 500`,
        [siteId],
      );
      return rows.map((row: Record<string, unknown>) => ({
        id: row.id as string,
        createdAt: (row.created_at as Date).toISOString(),
        actorName: (row.actor_name as string | null) ?? null,
        actorEmail: (row.actor_email as string | null) ?? null,
        entityType: row.entity_type as string,
        entityId: row.entity_id as string,
        action: row.action as string,
        strip:
          row.block === null || row.block === undefined
            ? null
            : {
                block: Number(row.block),
                position: Number(row.position),
                label: String(row.label),
              },
        before: (row.before as Record<string, unknown> | null) ?? null,
        after: (row.after as Record<string, unknown> | null) ?? null,
      }));
    },
  };
}
