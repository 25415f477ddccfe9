// The one definition of "sowing is on record" for a site, shared by trial and site queries.

/**
 * SQL that is true when sowing is on record for site `s`: a sowing date, or any strip with
 * measured data (the grower has started the season, so the map must stay as sown).
 */
export const SOWING_RECORDED_SQL = `(s.sowing_date IS NOT NULL OR EXISTS (
  SELECT 1 FROM strips st JOIN observations o ON o.strip_id = st.id
   WHERE st.site_id = s.id AND (
     o.seeds_sown IS NOT NULL OR o.stand_counts <> '[]'::jsonb OR o.head_counts <> '[]'::jsonb
     OR o.tiller_count IS NOT NULL OR o.grain_weight IS NOT NULL OR o.moisture_pct IS NOT NULL
     OR o.sowing_date IS NOT NULL OR o.emergence_date IS NOT NULL OR o.heading_date IS NOT NULL
     OR o.harvest_date IS NOT NULL OR o.test_weight IS NOT NULL)))`;
