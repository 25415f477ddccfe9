// Loads an invented 200-site trial (4 rates × 6 blocks, complete data) and one invented
// 5,000-strip site for the import benchmark. Bench data only; all numbers are made up.
import 'reflect-metadata';
import { createDataSource } from '../../db/data-source';

async function main() {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is required');
  const ds = createDataSource(url, { poolSize: 2 });
  await ds.initialize();
  const [network] = await ds.query(
    `SELECT id FROM networks WHERE slug = 'millbrook-valley-grain-circle'`,
  );
  const [grower] = await ds.query(`SELECT id FROM users WHERE email = 'grower1@millbrook.example'`);
  const out: Record<string, string> = {};
  await ds.transaction(async (m) => {
    const [trial] = await m.query(
      `INSERT INTO trials (network_id, name, status, crop, season, reference_rate, reference_unit, blocks_per_site, rows_per_strip,
         row_spacing_in, strip_length_ft, border_rows, thousand_kernel_weight_g, germination_pct, emergence_pct, seed_price_per_lb, grain_price_per_bu)
       VALUES ($1, 'Invented 200-site benchmark trial', 'in-field', 'wheat', '2028', 100, 'lb/acre', 6, 4, 8, 50, 1, 38, 92, 85, 0.5, 8)
       RETURNING id`,
      [network.id],
    );
    out.trialId = trial.id;
    await m.query(
      `INSERT INTO rate_levels (trial_id, position, multiplier, label)
       SELECT $1, p, (ARRAY[0.25, 0.5, 1, 2])[p], (ARRAY['quarter','half','full','double'])[p] FROM generate_series(1, 4) p`,
      [trial.id],
    );
    await m.query(
      `INSERT INTO sites (trial_id, grower_user_id, field_name, randomization_seed, randomized_at, data_version)
       SELECT $1, $2, 'Invented bench field ' || s, 'bench-' || s, now(), 1 FROM generate_series(1, 200) s`,
      [trial.id, grower.id],
    );
    // Rate order within a block rotates with the block number: a fixed Latin pattern is enough for timing.
    await m.query(
      `INSERT INTO strips (site_id, block, position, rate_level_id)
       SELECT s.id, b, p, r.id FROM sites s CROSS JOIN generate_series(1, 6) b CROSS JOIN generate_series(1, 4) p
         JOIN rate_levels r ON r.trial_id = s.trial_id AND r.position = ((p + b) % 4) + 1
        WHERE s.trial_id = $1`,
      [trial.id],
    );
    await m.query(
      `INSERT INTO observations (strip_id, stand_counts, stand_row_length, tiller_plants, tiller_count, head_counts, head_row_length,
          grain_weight, harvest_rows, harvest_length, moisture_pct)
       SELECT st.id, '[40, 42, 38, 41]', 3, 10, 18, '[70, 75, 72]', 3,
              round((3.2 + 1.2 * ln(1 + 4 * r.multiplier) + 0.6 * sin(st.block * 7 + st.position * 3 + hashtext(st.site_id::text) % 11))::numeric, 2),
              4, 50, 13.5
         FROM strips st JOIN rate_levels r ON r.id = st.rate_level_id JOIN sites s ON s.id = st.site_id WHERE s.trial_id = $1`,
      [trial.id],
    );
    const [site] = await m.query(
      `SELECT id FROM sites WHERE trial_id = $1 ORDER BY field_name LIMIT 1`,
      [trial.id],
    );
    out.siteId = site.id;

    // One big site for the 5,000-row import: 1,250 blocks × 4 rates.
    const [bigTrial] = await m.query(
      `INSERT INTO trials (network_id, name, status, crop, season, reference_rate, reference_unit, blocks_per_site, rows_per_strip,
         row_spacing_in, strip_length_ft, border_rows, thousand_kernel_weight_g, germination_pct, emergence_pct)
       VALUES ($1, 'Invented import benchmark trial', 'in-field', 'oats', '2028', 90, 'lb/acre', 12, 4, 8, 50, 1, 32, 90, 85) RETURNING id`,
      [network.id],
    );
    await m.query(
      `INSERT INTO rate_levels (trial_id, position, multiplier, label)
       SELECT $1, p, (ARRAY[0.25, 0.5, 1, 2])[p], (ARRAY['quarter','half','full','double'])[p] FROM generate_series(1, 4) p`,
      [bigTrial.id],
    );
    const [bigSite] = await m.query(
      `INSERT INTO sites (trial_id, grower_user_id, field_name, randomization_seed, randomized_at) VALUES ($1, $2, 'Invented import field', 'big', now()) RETURNING id`,
      [bigTrial.id, grower.id],
    );
    await m.query(
      `INSERT INTO strips (site_id, block, position, rate_level_id)
       SELECT $1, b, p, r.id FROM generate_series(1, 1250) b CROSS JOIN generate_series(1, 4) p
         JOIN rate_levels r ON r.trial_id = $2 AND r.position = ((p + b) % 4) + 1`,
      [bigSite.id, bigTrial.id],
    );
    out.importSiteId = bigSite.id;
  });
  await ds.destroy();
  console.log(JSON.stringify(out));
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
