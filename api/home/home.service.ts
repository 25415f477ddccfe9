// What a signed-in person sees first: the trials they can read and the sites they grow.
import type { DataSource } from 'typeorm';
import type { SiteSummary } from '../../shared/schemas/site';
import type { TrialSummary } from '../../shared/schemas/trial';

export function createHomeService(dataSource: DataSource) {
  /** Coordinators and admins see all their networks' trials; growers their own; members published ones. */
  async function listTrials(userId: string): Promise<TrialSummary[]> {
    const rows: {
      id: string;
      network_id: string;
      network_name: string;
      name: string;
      crop: TrialSummary['crop'];
      season: string | null;
      status: TrialSummary['status'];
      site_count: string;
    }[] = await dataSource.query(
      // "harvest-in" follows from the data: every site has a yield or is marked lost.
      `SELECT t.id, t.network_id, n.name AS network_name, t.name, t.crop, t.season,
                CASE WHEN t.status = 'in-field' AND EXISTS (SELECT 1 FROM sites s WHERE s.trial_id = t.id)
                      AND NOT EXISTS (SELECT 1 FROM sites s WHERE s.trial_id = t.id AND s.lost_reason IS NULL
                        AND NOT EXISTS (SELECT 1 FROM strips st JOIN observations o ON o.strip_id = st.id
                                         WHERE st.site_id = s.id AND o.grain_weight IS NOT NULL))
                     THEN 'harvest-in' ELSE t.status END AS status,
                (SELECT count(*) FROM sites s WHERE s.trial_id = t.id) AS site_count
           FROM trials t
           JOIN networks n ON n.id = t.network_id
           JOIN memberships m ON m.network_id = t.network_id AND m.user_id = $1
          WHERE m.role IN ('admin', 'coordinator')
             OR EXISTS (SELECT 1 FROM sites s WHERE s.trial_id = t.id AND s.grower_user_id = $1)
             OR EXISTS (SELECT 1 FROM report_snapshots r WHERE r.trial_id = t.id AND r.withdrawn_at IS NULL)
          ORDER BY t.season DESC NULLS LAST, t.created_at DESC`,
      [userId],
    );
    return rows.map((r) => ({
      id: r.id,
      networkId: r.network_id,
      networkName: r.network_name,
      name: r.name,
      crop: r.crop,
      season: r.season,
      status: r.status,
      siteCount: Number(r.site_count),
    }));
  }

  async function listMySites(userId: string): Promise<SiteSummary[]> {
    const rows: {
      id: string;
      trial_id: string;
      trial_name: string;
      crop: string | null;
      season: string | null;
      field_name: string;
      grower_name: string | null;
      grower_email: string | null;
      randomized: boolean;
      strip_count: string;
      with_yield: string;
      published_at: Date | null;
    }[] = await dataSource.query(
      `SELECT s.id, s.trial_id, t.name AS trial_name, t.crop, t.season, s.field_name, u.name AS grower_name,
                COALESCE(u.email, s.grower_email) AS grower_email, s.randomized_at IS NOT NULL AS randomized,
                (SELECT count(*) FROM strips st WHERE st.site_id = s.id) AS strip_count,
                (SELECT count(*) FROM strips st JOIN observations o ON o.strip_id = st.id
                  WHERE st.site_id = s.id AND o.grain_weight IS NOT NULL) AS with_yield,
                s.published_at
           FROM sites s JOIN trials t ON t.id = s.trial_id LEFT JOIN users u ON u.id = s.grower_user_id
          WHERE s.grower_user_id = $1
          ORDER BY t.season DESC NULLS LAST, t.name, s.field_name`,
      [userId],
    );
    return rows.map((r) => ({
      id: r.id,
      trialId: r.trial_id,
      trialName: r.trial_name,
      crop: r.crop,
      season: r.season,
      fieldName: r.field_name,
      growerName: r.grower_name,
      growerEmail: r.grower_email,
      randomized: r.randomized,
      stripCount: Number(r.strip_count),
      stripsWithYield: Number(r.with_yield),
      publishedAt: r.published_at ? new Date(r.published_at).toISOString() : null,
    }));
  }

  return { listTrials, listMySites };
}
