// The invented demo scenario: the Millbrook Valley Grain Circle, a made-up network of small
// farms. Every name, field and number here is invented by a seeded generator; none is real.
import seedrandom from 'seedrandom';
import type { DataSource, EntityManager } from 'typeorm';
import { randomizeRcbd } from '../../shared/design/randomize-rcbd';
import bcrypt from 'bcryptjs';
import { Membership } from '../entities/membership.entity';
import { Network } from '../entities/network.entity';
import { Observation } from '../entities/observation.entity';
import { RateLevelRow } from '../entities/rate-level.entity';
import { Site } from '../entities/site.entity';
import { Strip } from '../entities/strip.entity';
import { Trial } from '../entities/trial.entity';
import { TrialSeries } from '../entities/trial-series.entity';
import { User } from '../entities/user.entity';

export const DEMO_PASSWORD = 'sheaf-demo';
export const DEMO_NETWORK_SLUG = 'millbrook-valley-grain-circle';
export const DEMO_ACCOUNTS = [
  { email: 'admin@millbrook.example', name: 'Ada Admin (invented)', role: 'admin' },
  { email: 'coordinator@millbrook.example', name: 'Corin Hale (invented)', role: 'coordinator' },
  ...Array.from({ length: 8 }, (_, i) => ({
    email: `grower${i + 1}@millbrook.example`,
    name: `${['Ines Bell', 'Tomas Reyes', 'Wren Okafor', 'Pia Lund', 'Sol Marsh', 'June Ashby', 'Rafe Dunmore', 'Lark Penhallow'][i]} (invented)`,
    role: 'grower' as const,
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
export async function seedDemo(
  dataSource: DataSource,
  options: { passwordCost?: number } = {},
): Promise<boolean> {
  if (await dataSource.getRepository(Network).existsBy({ slug: DEMO_NETWORK_SLUG })) return false;
  // bcrypt directly (db/ does not import api/); sign-in reads the cost from the hash itself.
  const passwordHash = await bcrypt.hash(DEMO_PASSWORD, options.passwordCost ?? 11);
  await dataSource.transaction(async (manager) => {
    const network = await manager.getRepository(Network).save({
      name: 'Millbrook Valley Grain Circle (invented demo)',
      slug: DEMO_NETWORK_SLUG,
      isDemo: true,
    });
    const userIds: Record<string, string> = {};
    for (const account of DEMO_ACCOUNTS) {
      const users = manager.getRepository(User);
      const user =
        (await users.findOneBy({ email: account.email })) ??
        (await users.save({ email: account.email, name: account.name, passwordHash }));
      userIds[account.email] = user.id;
      await manager.getRepository(Membership).upsert(
        { userId: user.id, networkId: network.id, role: account.role },
        {
          conflictPaths: ['userId', 'networkId'],
          skipUpdateIfNoValuesChanged: true,
        },
      );
    }
    const coordinatorId = userIds['coordinator@millbrook.example'] ?? null;
    const series = await manager.getRepository(TrialSeries).save({
      networkId: network.id,
      name: 'Hulless oat seeding rate, 2026 onwards (invented)',
      crop: 'hullessOats',
      createdBy: coordinatorId,
    });
    // Last season's trial, run on paper and typed in by the coordinator (so no grower accounts
    // on its sites); closed, with its reports published by the demo publishing step.
    await seedOatTrial(manager, network.id, userIds, OAT_2027, series.id);
    await seedOatTrial(manager, network.id, userIds, OAT_2026, series.id);
    await seedWheatDraft(manager, network.id, userIds['coordinator@millbrook.example']!);
  });
  return true;
}

interface OatSeason {
  season: string;
  status: 'in-field' | 'closed';
  fields: readonly { field: string; soil: string; previous: string; fertility: string }[];
  /** Growers' accounts on the sites (false: the coordinator entered the data from paper). */
  growerAccounts: boolean;
  /** Yield response (bu/acre) = top − drop·exp(−2.3·multiplier)·site slope: the season's weather. */
  top: number;
  drop: number;
}

const OAT_2027: OatSeason = {
  season: '2027',
  status: 'in-field',
  fields: FIELDS,
  growerAccounts: true,
  top: 62,
  drop: 26,
};

/** A drier invented 2026 on six of the same farms (other fields in the rotation). */
const OAT_2026: OatSeason = {
  season: '2026',
  status: 'closed',
  fields: [
    { field: 'Creekside upper field', soil: 'silt loam', previous: 'oats', fertility: 'none' },
    { field: 'Orchard edge', soil: 'sandy loam', previous: 'garlic', fertility: 'none' },
    { field: 'Hilltop east', soil: 'clay loam', previous: 'red clover', fertility: 'none' },
    {
      field: 'Barn paddock',
      soil: 'loam',
      previous: 'winter squash',
      fertility: 'composted manure 2 t/acre',
    },
    { field: 'Willow rise', soil: 'silt loam', previous: 'buckwheat', fertility: 'none' },
    { field: 'South bench', soil: 'sandy loam', previous: 'field peas', fertility: 'none' },
  ],
  growerAccounts: false,
  top: 55,
  drop: 22,
};

async function seedOatTrial(
  manager: EntityManager,
  networkId: string,
  userIds: Record<string, string>,
  plan: OatSeason,
  seriesId: string,
) {
  const layout = OAT_LAYOUT;
  const year = plan.season;
  const trial = await manager.getRepository(Trial).save({
    networkId,
    name: `Hulless oat seeding rate ${year}`,
    question:
      'Does half the usual hulless-oat seeding rate yield as well as the full rate on our farms?',
    status: plan.status,
    closedAt: plan.status === 'closed' ? new Date(`${Number(year) + 1}-01-20T12:00:00Z`) : null,
    crop: 'hullessOats',
    season: year,
    seriesId,
    unitSystem: 'imperial',
    referenceRate: layout.referenceLbPerAcre,
    referenceUnit: 'lb/acre',
    blocksPerSite: 4,
    rowsPerStrip: layout.rowsPerStrip,
    rowSpacingIn: layout.rowSpacingIn,
    stripLengthFt: layout.stripLengthFt,
    borderRows: 1,
    thousandKernelWeightG: layout.tkwG,
    germinationPct: layout.germination,
    emergencePct: layout.emergence,
    seedPricePerLb: 0.9,
    grainPricePerBu: 9.5,
    createdBy: userIds['coordinator@millbrook.example'] ?? null,
  });
  const levels = [
    { multiplier: 0.25, label: 'quarter' },
    { multiplier: 0.5, label: 'half' },
    { multiplier: 1, label: 'full' },
    { multiplier: 2, label: 'double' },
  ];
  const levelIds: string[] = [];
  for (const [i, level] of levels.entries()) {
    const row = await manager.getRepository(RateLevelRow).save({
      trialId: trial.id,
      position: i + 1,
      multiplier: level.multiplier,
      label: level.label,
    });
    levelIds.push(row.id);
  }
  const multiplierOf = new Map(levelIds.map((id, i) => [id, levels[i]!.multiplier]));
  const random = seedrandom(`millbrook-demo-${year}`);
  // Seeds per ft² at the full rate: lb/acre × g/lb ÷ TKW(g/1000 seeds) ÷ ft²/acre.
  const fullSeedsPerFt2 = (layout.referenceLbPerAcre * 453.59237) / (layout.tkwG / 1000) / 43560;
  const harvestAreaFt2 = layout.rowsPerStrip * (layout.rowSpacingIn / 12) * layout.stripLengthFt;

  for (let s = 0; s < plan.fields.length; s += 1) {
    const growerEmail = `grower${s + 1}@millbrook.example`;
    const growerUserId = plan.growerAccounts ? (userIds[growerEmail] ?? null) : null;
    const field = plan.fields[s]!;
    const siteEffect = normal(random, 0, 9);
    const siteSlope = normal(random, 1, 0.35);
    const seed = year === '2027' ? `demo-site-${s + 1}` : `demo-site-${year}-${s + 1}`;
    const site = await manager.getRepository(Site).save({
      trialId: trial.id,
      growerUserId,
      fieldName: field.field,
      soil: field.soil,
      previousCrop: field.previous,
      fertility: field.fertility,
      notes: plan.growerAccounts
        ? 'Invented demo site.'
        : 'Invented demo site; entered by the coordinator from the paper field sheets.',
      randomizationSeed: seed,
      randomizedAt: new Date(),
      sowingDate: `${year}-04-${String(10 + s).padStart(2, '0')}`,
      emergenceDate: `${year}-04-${String(22 + s).padStart(2, '0')}`,
      headingDate: `${year}-06-${String(18 + s).padStart(2, '0')}`,
      harvestDate: `${year}-08-${String(2 + s).padStart(2, '0')}`,
      dataVersion: 1,
    });
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
        const response = plan.top - plan.drop * Math.exp(-2.3 * multiplier) * siteSlope;
        const yieldBu = Math.max(15, response + siteEffect + blockEffect + normal(random, 0, 3));
        const moisture = round(normal(random, 13.2, 1.1), 1);
        const dryLb = (yieldBu * BUSHEL_LB * harvestAreaFt2) / 43560;
        const grainWeight = round((dryLb * (100 - STANDARD_MOISTURE)) / (100 - moisture), 2);
        const strip = await manager.getRepository(Strip).save({
          siteId: site.id,
          block: b + 1,
          position: p + 1,
          rateLevelId: levelId,
          version: 1,
        });
        await manager.getRepository(Observation).insert({
          stripId: strip.id,
          seedsSown: Math.round(seedsPerFt2 * harvestAreaFt2),
          standCounts,
          standRowLength: 3,
          tillerPlants,
          tillerCount: Math.round(tillersPerPlant * tillerPlants),
          headCounts,
          headRowLength: 3,
          grainWeight,
          harvestRows: layout.rowsPerStrip,
          harvestLength: layout.stripLengthFt,
          moisturePct: moisture,
          testWeight: round(normal(random, 44, 2), 1),
          notes: '',
          updatedBy: growerUserId ?? userIds['coordinator@millbrook.example'] ?? null,
        });
      }
    }
  }
}

async function seedWheatDraft(manager: EntityManager, networkId: string, coordinatorId: string) {
  const trial = await manager.getRepository(Trial).save({
    networkId,
    name: 'Winter wheat seeding rate 2027–28',
    question: 'Can we sow winter wheat thinner without losing yield?',
    status: 'draft',
    crop: 'wheat',
    season: '2027',
    unitSystem: 'imperial',
    referenceRate: 100,
    referenceUnit: 'lb/acre',
    blocksPerSite: 4,
    rowsPerStrip: 4,
    rowSpacingIn: 8,
    stripLengthFt: 60,
    borderRows: 1,
    thousandKernelWeightG: 38,
    germinationPct: 92,
    emergencePct: 85,
    seedPricePerLb: 0.55,
    grainPricePerBu: 8.0,
    createdBy: coordinatorId,
  });
  for (const [i, level] of [
    { multiplier: 0.25, label: 'quarter' },
    { multiplier: 0.5, label: 'half' },
    { multiplier: 1, label: 'full' },
    { multiplier: 2, label: 'double' },
  ].entries()) {
    await manager.getRepository(RateLevelRow).insert({
      trialId: trial.id,
      position: i + 1,
      multiplier: level.multiplier,
      label: level.label,
    });
  }
}
