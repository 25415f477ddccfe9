// The invented demo scenario: the Millbrook Valley Grain Circle, a made-up network of small
// farms. Every name, field and number here is invented by a seeded generator; none is real.
import seedrandom from 'seedrandom';
import type { DataSource, EntityManager } from 'typeorm';
import { randomizeRcbd } from '../../shared/design/randomize-rcbd';
import { hashPassword } from '../../api/auth/auth.service';

export const DEMO_PASSWORD = 'sheaf-demo';
export const DEMO_NETWORK_SLUG = 'millbrook-valley-grain-circle';
export const DEMO_ACCOUNTS = [
  { email: 'admin@millbrook.example', name: 'Ada Admin (invented)', role: 'admin' },
  { email: 'coordinator@millbrook.example', name: 'Corin Hale (invented)', role: 'coordinator' },
  ...Array.from({ length: 8 }, (_, i) => ({
    email: `grower${i + 1}@millbrook.example`,
    name: `${['Ines Bell', 'Tomas Reyes', 'Wren Okafor', 'Pia Lund', 'Sol Marsh', 'June Ashby', 'Rafe Dunmore', 'Lark Penhallow'][i]} (invented)`,
    role: 'grower',
  })),
  { email: 'member@millbrook.example', name: 'Mo Member (invented)', role: 'member' },
] as const;

const FIELDS = [
  {
    field: 'Creekside lower field',
    soil: 'silt loam',
    previous: 'red clover',
    fertility: 'composted manure 4 t/acre',
  },
  { field: 'Orchard strip', soil: 'sandy loam', previous: 'squash', fertility: 'none' },
  {
    field: 'Hilltop paddock',
    soil: 'clay loam',
    previous: 'winter rye',
    fertility: 'feather meal 30 lb N/acre',
  },
  {
    field: 'Barn field',
    soil: 'loam',
    previous: 'potatoes',
    fertility: 'composted manure 2 t/acre',
  },
  { field: 'Willow bottom', soil: 'silt loam', previous: 'field peas', fertility: 'none' },
  {
    field: 'South terrace',
    soil: 'sandy loam',
    previous: 'buckwheat',
    fertility: 'pelleted poultry litter 1 t/acre',
  },
  { field: 'Long acre', soil: 'clay loam', previous: 'sweet corn', fertility: 'none' },
  {
    field: 'Stone wall field',
    soil: 'loam',
    previous: 'hairy vetch',
    fertility: 'composted manure 3 t/acre',
  },
];

/** Hulless oats, demo assumptions (invented): oats' USDA bushel of 32 lb and 14 % moisture base. */
const BUSHEL_LB = 32;
const STANDARD_MOISTURE = 14;
const OAT_LAYOUT = {
  rowsPerStrip: 4,
  rowSpacingIn: 8,
  stripLengthFt: 50,
  referenceLbPerAcre: 80,
  tkwG: 25,
  germination: 88,
  emergence: 80,
};

function normal(random: () => number, mean: number, sd: number): number {
  const u = Math.max(random(), 1e-12);
  const v = random();
  return mean + sd * Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

function round(value: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(value * f) / f;
}

/** Loads the demo once; returns false when it is already there (restart-safe). */
export async function seedDemo(dataSource: DataSource): Promise<boolean> {
  const existing = await dataSource.query('SELECT 1 FROM networks WHERE slug = $1', [
    DEMO_NETWORK_SLUG,
  ]);
  if (existing.length > 0) return false;
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await dataSource.transaction(async (manager) => {
    const [network] = await manager.query(
      `INSERT INTO networks (name, slug, is_demo) VALUES ($1, $2, true) RETURNING id`,
      ['Millbrook Valley Grain Circle (invented demo)', DEMO_NETWORK_SLUG],
    );
    const userIds: Record<string, string> = {};
    for (const account of DEMO_ACCOUNTS) {
      const [user] = await manager.query(
        `INSERT INTO users (email, name, password_hash) VALUES ($1, $2, $3)
         ON CONFLICT (email) DO UPDATE SET name = EXCLUDED.name RETURNING id`,
        [account.email, account.name, passwordHash],
      );
      userIds[account.email] = user.id;
      await manager.query(
        'INSERT INTO memberships (user_id, network_id, role) VALUES ($1, $2, $3) ON CONFLICT DO NOTHING',
        [user.id, network.id, account.role],
      );
    }
    await seedOatTrial(manager, network.id, userIds);
    await seedWheatDraft(manager, network.id, userIds['coordinator@millbrook.example']!);
  });
  return true;
}

async function seedOatTrial(
  manager: EntityManager,
  networkId: string,
  userIds: Record<string, string>,
) {
  const layout = OAT_LAYOUT;
  const [trial] = await manager.query(
    `INSERT INTO trials (network_id, name, question, status, crop, season, unit_system, reference_rate, reference_unit,
        blocks_per_site, rows_per_strip, row_spacing_in, strip_length_ft, border_rows, thousand_kernel_weight_g,
        germination_pct, emergence_pct, seed_price_per_lb, grain_price_per_bu, created_by)
     VALUES ($1, $2, $3, 'in-field', 'hullessOats', '2027', 'imperial', $4, 'lb/acre', 4, $5, $6, $7, 1, $8, $9, $10, 0.9, 9.5, $11)
     RETURNING id`,
    [
      networkId,
      'Hulless oat seeding rate 2027',
      'Does half the usual hulless-oat seeding rate yield as well as the full rate on our farms?',
      layout.referenceLbPerAcre,
      layout.rowsPerStrip,
      layout.rowSpacingIn,
      layout.stripLengthFt,
      layout.tkwG,
      layout.germination,
      layout.emergence,
      userIds['coordinator@millbrook.example'],
    ],
  );
  const levels = [
    { multiplier: 0.25, label: 'quarter' },
    { multiplier: 0.5, label: 'half' },
    { multiplier: 1, label: 'full' },
    { multiplier: 2, label: 'double' },
  ];
  const levelIds: string[] = [];
  for (const [i, level] of levels.entries()) {
    const [row] = await manager.query(
      'INSERT INTO rate_levels (trial_id, position, multiplier, label) VALUES ($1, $2, $3, $4) RETURNING id',
      [trial.id, i + 1, level.multiplier, level.label],
    );
    levelIds.push(row.id);
  }
  const multiplierOf = new Map(levelIds.map((id, i) => [id, levels[i]!.multiplier]));
  const random = seedrandom('millbrook-demo-2027');
  // Seeds per ft² at the full rate: lb/acre × g/lb ÷ TKW(g/1000 seeds) ÷ ft²/acre.
  const fullSeedsPerFt2 = (layout.referenceLbPerAcre * 453.59237) / (layout.tkwG / 1000) / 43560;
  const harvestAreaFt2 = layout.rowsPerStrip * (layout.rowSpacingIn / 12) * layout.stripLengthFt;

  for (let s = 0; s < 8; s += 1) {
    const growerEmail = `grower${s + 1}@millbrook.example`;
    const field = FIELDS[s]!;
    const siteEffect = normal(random, 0, 9);
    const siteSlope = normal(random, 1, 0.35);
    const seed = `demo-site-${s + 1}`;
    const [site] = await manager.query(
      `INSERT INTO sites (trial_id, grower_user_id, field_name, soil, previous_crop, fertility, notes,
          randomization_seed, randomized_at, sowing_date, emergence_date, heading_date, harvest_date, data_version)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, now(), $9, $10, $11, $12, 1) RETURNING id`,
      [
        trial.id,
        userIds[growerEmail],
        field.field,
        field.soil,
        field.previous,
        field.fertility,
        'Invented demo site.',
        seed,
        `2027-04-${String(10 + s).padStart(2, '0')}`,
        `2027-04-${String(22 + s).padStart(2, '0')}`,
        `2027-06-${String(18 + s).padStart(2, '0')}`,
        `2027-08-${String(2 + s).padStart(2, '0')}`,
      ],
    );
    const map = randomizeRcbd(levelIds, 4, seed);
    for (const [b, order] of map.entries()) {
      const blockEffect = normal(random, 0, 2.5);
      for (const [p, levelId] of order.entries()) {
        const multiplier = multiplierOf.get(levelId)!;
        const seedsPerFt2 = fullSeedsPerFt2 * multiplier;
        // Establishment falls as the rate rises (stand loss grows with crowding).
        const establishment = Math.min(
          0.97,
          Math.max(0.45, normal(random, 0.86 - 0.06 * Math.log2(multiplier), 0.04)),
        );
        const plantsPerFt2 = seedsPerFt2 * establishment;
        const plantsPerFtRow = plantsPerFt2 * (layout.rowSpacingIn / 12);
        const standCounts = Array.from({ length: 6 }, () =>
          Math.max(
            0,
            Math.round(normal(random, plantsPerFtRow * 3, Math.sqrt(plantsPerFtRow * 3) + 1)),
          ),
        );
        // Thin stands compensate with tillers.
        const tillersPerPlant = Math.max(
          0.2,
          normal(random, 2.6 / Math.sqrt(multiplier) - 0.6, 0.2),
        );
        const tillerPlants = 10;
        const headsPerPlant = Math.max(1, 0.9 + tillersPerPlant * 0.55);
        const headsPerFtRow = plantsPerFtRow * headsPerPlant;
        const headCounts = Array.from({ length: 4 }, () =>
          Math.max(
            0,
            Math.round(normal(random, headsPerFtRow * 3, Math.sqrt(headsPerFtRow * 3) + 1)),
          ),
        );
        // Yield response (bu/acre): rises steeply to the full rate, flat to slightly down beyond.
        const response = 62 - 26 * Math.exp(-2.3 * multiplier) * siteSlope;
        const yieldBu = Math.max(15, response + siteEffect + blockEffect + normal(random, 0, 3));
        const moisture = round(normal(random, 13.2, 1.1), 1);
        const dryLb = (yieldBu * BUSHEL_LB * harvestAreaFt2) / 43560;
        const grainWeight = round((dryLb * (100 - STANDARD_MOISTURE)) / (100 - moisture), 2);
        const [strip] = await manager.query(
          'INSERT INTO strips (site_id, block, position, rate_level_id, version) VALUES ($1, $2, $3, $4, 1) RETURNING id',
          [site.id, b + 1, p + 1, levelId],
        );
        await manager.query(
          `INSERT INTO observations (strip_id, seeds_sown, stand_counts, stand_row_length, tiller_plants, tiller_count,
             head_counts, head_row_length, grain_weight, harvest_rows, harvest_length, moisture_pct, test_weight, notes, updated_by)
           VALUES ($1, $2, $3, 3, $4, $5, $6, 3, $7, $8, $9, $10, $11, '', $12)`,
          [
            strip.id,
            Math.round(seedsPerFt2 * harvestAreaFt2),
            JSON.stringify(standCounts),
            tillerPlants,
            Math.round(tillersPerPlant * tillerPlants),
            JSON.stringify(headCounts),
            grainWeight,
            layout.rowsPerStrip,
            layout.stripLengthFt,
            moisture,
            round(normal(random, 44, 2), 1),
            userIds[growerEmail],
          ],
        );
      }
    }
  }
}

async function seedWheatDraft(manager: EntityManager, networkId: string, coordinatorId: string) {
  const [trial] = await manager.query(
    `INSERT INTO trials (network_id, name, question, status, crop, season, unit_system, reference_rate, reference_unit,
        blocks_per_site, rows_per_strip, row_spacing_in, strip_length_ft, border_rows, thousand_kernel_weight_g,
        germination_pct, emergence_pct, seed_price_per_lb, grain_price_per_bu, created_by)
     VALUES ($1, $2, $3, 'draft', 'wheat', '2027', 'imperial', 100, 'lb/acre', 4, 4, 8, 60, 1, 38, 92, 85, 0.55, 8.0, $4)
     RETURNING id`,
    [
      networkId,
      'Winter wheat seeding rate 2027–28',
      'Can we sow winter wheat thinner without losing yield?',
      coordinatorId,
    ],
  );
  for (const [i, level] of [
    { multiplier: 0.25, label: 'quarter' },
    { multiplier: 0.5, label: 'half' },
    { multiplier: 1, label: 'full' },
    { multiplier: 2, label: 'double' },
  ].entries()) {
    await manager.query(
      'INSERT INTO rate_levels (trial_id, position, multiplier, label) VALUES ($1, $2, $3, $4)',
      [trial.id, i + 1, level.multiplier, level.label],
    );
  }
}
