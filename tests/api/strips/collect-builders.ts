// Builders for collection tests: a fresh trial with one site per grower of a built network,
// strips in blocks, and optional complete observations; nothing touches the demo data.
import type { DataSource } from 'typeorm';
import {
  buildNetwork,
  createTestApp,
  signIn,
  type BuiltNetwork,
  type Client,
  type TestApp,
} from '../../helpers/app';

export interface CollectStrip {
  id: string;
  block: number;
  position: number;
  label: string;
  multiplier: number;
}

export interface CollectSite {
  trialId: string;
  siteId: string;
  /** A second site of the same trial, sown by grower2. */
  otherSiteId: string;
  strips: CollectStrip[];
  fieldName: string;
}

export interface CollectOptions {
  unitSystem?: 'imperial' | 'metric';
  crop?: string;
  blocks?: number;
  levels?: { multiplier: number; label: string }[];
  fieldName?: string;
}

/** Oats in 8-inch rows, 90 lb/acre at the full rate, TKW 32 g (an invented test trial). */
export async function buildCollectSite(
  dataSource: DataSource,
  net: BuiltNetwork,
  options: CollectOptions = {},
): Promise<CollectSite> {
  const q = (sql: string, params: unknown[]) => dataSource.query(sql, params);
  const levels = options.levels ?? [
    { multiplier: 0.5, label: 'half' },
    { multiplier: 1, label: 'full' },
    { multiplier: 2, label: 'double' },
  ];
  const blocks = options.blocks ?? 2;
  const fieldName = options.fieldName ?? `Test field ${net.suffix}`;
  const [trial] = await q(
    `INSERT INTO trials (network_id, name, status, crop, season, unit_system, reference_rate, reference_unit, blocks_per_site,
       rows_per_strip, row_spacing_in, strip_length_ft, border_rows, thousand_kernel_weight_g, germination_pct, emergence_pct,
       seed_price_per_lb, grain_price_per_bu)
     VALUES ($1, $2, 'in-field', $3, '2027', $4, 90, 'lb/acre', $5, 4, 8, 50, 1, 32, 90, 85, 0.5, 4) RETURNING id`,
    [
      net.networkId,
      `Collect trial ${net.suffix}`,
      options.crop ?? 'oats',
      options.unitSystem ?? 'imperial',
      blocks,
    ],
  );
  const levelIds: string[] = [];
  for (const [i, level] of levels.entries()) {
    const [row] = await q(
      'INSERT INTO rate_levels (trial_id, position, multiplier, label) VALUES ($1, $2, $3, $4) RETURNING id',
      [trial.id, i + 1, level.multiplier, level.label],
    );
    levelIds.push(row.id);
  }
  const makeSite = async (growerId: string, name: string) => {
    const [site] = await q(
      `INSERT INTO sites (trial_id, grower_user_id, field_name, randomization_seed, randomized_at) VALUES ($1, $2, $3, 'seed', now()) RETURNING id`,
      [trial.id, growerId, name],
    );
    const strips: CollectStrip[] = [];
    for (let block = 1; block <= blocks; block += 1) {
      // A fixed rotation stands in for the randomized order.
      for (let p = 0; p < levels.length; p += 1) {
        const index = (p + block) % levels.length;
        const [strip] = await q(
          'INSERT INTO strips (site_id, block, position, rate_level_id) VALUES ($1, $2, $3, $4) RETURNING id',
          [site.id, block, p + 1, levelIds[index]],
        );
        strips.push({
          id: strip.id,
          block,
          position: p + 1,
          label: levels[index]!.label,
          multiplier: levels[index]!.multiplier,
        });
      }
    }
    return { siteId: site.id as string, strips };
  };
  const own = await makeSite(net.userIds.grower, fieldName);
  const other = await makeSite(net.userIds.grower2, `Other field ${net.suffix}`);
  return {
    trialId: trial.id,
    siteId: own.siteId,
    otherSiteId: other.siteId,
    strips: own.strips,
    fieldName,
  };
}

export interface OpenedCollectSite {
  t: TestApp;
  net: BuiltNetwork;
  site: CollectSite;
  grower: Client;
  coordinator: Client;
}

/** A test app with a fresh network and collect site, and its grower and coordinator signed in. */
export async function openCollectSite(
  networkLabel: string,
  options: CollectOptions = {},
): Promise<OpenedCollectSite> {
  const t = await createTestApp();
  const net = await buildNetwork(t.dataSource, networkLabel);
  const site = await buildCollectSite(t.dataSource, net, options);
  const grower = await signIn(t.app, net.emails.grower);
  const coordinator = await signIn(t.app, net.emails.coordinator);
  return { t, net, site, grower, coordinator };
}

export async function stripVersion(dataSource: DataSource, stripId: string): Promise<number> {
  const [row] = await dataSource.query('SELECT version FROM strips WHERE id = $1', [stripId]);
  return Number(row.version);
}

export async function dataVersion(dataSource: DataSource, siteId: string): Promise<number> {
  const [row] = await dataSource.query('SELECT data_version FROM sites WHERE id = $1', [siteId]);
  return Number(row.data_version);
}

export async function publishSite(dataSource: DataSource, siteId: string): Promise<void> {
  await dataSource.query('UPDATE sites SET published_at = now() WHERE id = $1', [siteId]);
}
