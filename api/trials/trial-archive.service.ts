// Everything a network holds about one trial, as one zip: the design, sites, strip layout,
// observations, photo metadata and history, each file described in a README.
import yazl from 'yazl';
import { In, type DataSource } from 'typeorm';
import { rateTable } from '../../shared/design/rate-table';
import { AuditEvent } from '../../db/entities/audit-event.entity';
import { Attachment } from '../../db/entities/attachment.entity';
import { Network } from '../../db/entities/network.entity';
import { Observation } from '../../db/entities/observation.entity';
import { RateLevelRow } from '../../db/entities/rate-level.entity';
import { Site } from '../../db/entities/site.entity';
import { Strip } from '../../db/entities/strip.entity';
import { Trial } from '../../db/entities/trial.entity';
import { User } from '../../db/entities/user.entity';
import { NotFound } from '../errors';
import { farmLabel } from '../lib/site-names';

type Cell = string | number | boolean | null | undefined | Date;

/** RFC 4180 CSV; cells that a spreadsheet would run as a formula get a leading apostrophe. */
export function toCsv(header: readonly string[], rows: readonly Cell[][]): string {
  const cell = (value: Cell): string => {
    if (value === null || value === undefined) return '';
    let text = value instanceof Date ? value.toISOString() : String(value);
    if (typeof value === 'string' && /^[=+\-@\t\r]/.test(text)) text = `'${text}`;
    return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
  };
  return [header, ...rows].map((row) => row.map(cell).join(',')).join('\r\n') + '\r\n';
}

export function createTrialArchiveService(dataSource: DataSource) {
  async function build(trialId: string): Promise<{ fileName: string; zip: Buffer }> {
    const db = dataSource.manager;
    const trial = await db.getRepository(Trial).findOneBy({ id: trialId });
    if (!trial) throw new NotFound('Trial');
    const [network, levels, sites] = await Promise.all([
      db.getRepository(Network).findOneBy({ id: trial.networkId }),
      db.getRepository(RateLevelRow).find({ where: { trialId }, order: { position: 'ASC' } }),
      db.getRepository(Site).find({ where: { trialId }, order: { reportNumber: 'ASC' } }),
    ]);
    const siteIds = sites.map((s) => s.id);
    const [strips, photos, audit] = await Promise.all([
      siteIds.length
        ? db
            .getRepository(Strip)
            .createQueryBuilder('st')
            .leftJoinAndMapOne('st.observation', Observation, 'o', 'o.strip_id = st.id')
            .where('st.site_id IN (:...siteIds)', { siteIds })
            .orderBy('st.site_id')
            .addOrderBy('st.block')
            .addOrderBy('st.position')
            .getMany()
        : [],
      siteIds.length
        ? db
            .getRepository(Attachment)
            .createQueryBuilder('a')
            .where('a.site_id IN (:...siteIds)', { siteIds })
            .orderBy('a.created_at')
            .getMany()
        : [],
      db
        .getRepository(AuditEvent)
        .createQueryBuilder('e')
        .where(
          siteIds.length
            ? '(e.entity_id = :trialId OR e.site_id IN (:...siteIds))'
            : 'e.entity_id = :trialId',
          { trialId, siteIds },
        )
        .orderBy('e.created_at')
        .getMany(),
    ]);
    const userIds = [
      ...new Set(
        [
          ...sites.map((s) => s.growerUserId),
          ...audit.map((e) => e.actorUserId),
          ...photos.map((p) => p.uploadedBy),
        ].filter((id): id is string => !!id),
      ),
    ];
    const users = new Map(
      (userIds.length ? await db.getRepository(User).findBy({ id: In(userIds) }) : []).map(
        (user) => [user.id, user] as const,
      ),
    );
    const siteById = new Map(sites.map((s) => [s.id, s]));
    const levelById = new Map(levels.map((l) => [l.id, l]));
    const metric = trial.unitSystem === 'metric';
    const u = metric
      ? { length: 'm', weight: 'kg', area: 'm2' }
      : { length: 'ft', weight: 'lb', area: 'ft2' };
    const amounts = new Map(
      rateTable({ ...trial, rateLevels: levels }).map((r) => [r.rateLevelId, r] as const),
    );

    const design = {
      id: trial.id,
      network: network?.name ?? null,
      name: trial.name,
      question: trial.question,
      status: trial.status,
      closedAt: trial.closedAt,
      crop: trial.crop,
      customCrop: trial.customCrop,
      season: trial.season,
      unitSystem: trial.unitSystem,
      referenceRate: trial.referenceRate,
      referenceUnit: trial.referenceUnit,
      rateLevels: levels.map((l) => ({ id: l.id, multiplier: l.multiplier, label: l.label })),
      blocksPerSite: trial.blocksPerSite,
      rowsPerStrip: trial.rowsPerStrip,
      rowSpacingIn: trial.rowSpacingIn,
      stripLengthFt: trial.stripLengthFt,
      borderRows: trial.borderRows,
      thousandKernelWeightG: trial.thousandKernelWeightG,
      germinationPct: trial.germinationPct,
      emergencePct: trial.emergencePct,
      seedPricePerLb: trial.seedPricePerLb,
      grainPricePerBu: trial.grainPricePerBu,
      createdAt: trial.createdAt,
      updatedAt: trial.updatedAt,
    };

    const sitesCsv = toCsv(
      [
        'site_id',
        'report_label',
        'field_name',
        'named_in_reports',
        'grower_name',
        'grower_email',
        'soil',
        'previous_crop',
        'fertility',
        'notes',
        'sowing_date',
        'emergence_date',
        'heading_date',
        'harvest_date',
        'randomization_seed',
        'randomized_at',
        'lost_reason',
        'packet_reissued_at',
        'report_published_at',
      ],
      sites.map((s) => {
        const grower = s.growerUserId ? users.get(s.growerUserId) : undefined;
        return [
          s.id,
          farmLabel(s.reportNumber),
          s.fieldName,
          s.namedInReports,
          grower?.name,
          grower?.email ?? s.growerEmail,
          s.soil,
          s.previousCrop,
          s.fertility,
          s.notes,
          s.sowingDate,
          s.emergenceDate,
          s.headingDate,
          s.harvestDate,
          s.randomizationSeed,
          s.randomizedAt,
          s.lostReason,
          s.packetReissuedAt,
          s.publishedAt,
        ];
      }),
    );

    type StripWithObservation = Strip & { observation?: Observation };
    const layoutCsv = toCsv(
      [
        'site_id',
        'report_label',
        'block',
        'position',
        'strip_id',
        'rate_label',
        'rate_multiplier',
        'seed_grams_per_strip',
        'seeds_per_foot_of_row',
      ],
      (strips as StripWithObservation[]).map((st) => {
        const level = levelById.get(st.rateLevelId);
        const amount = amounts.get(st.rateLevelId);
        return [
          st.siteId,
          farmLabel(siteById.get(st.siteId)?.reportNumber ?? 0),
          st.block,
          st.position,
          st.id,
          level?.label,
          level?.multiplier,
          amount ? Math.round(amount.gramsPerStrip * 10) / 10 : null,
          amount ? Math.round(amount.seedsPerFootOfRow * 100) / 100 : null,
        ];
      }),
    );

    const observationsCsv = toCsv(
      [
        'strip_id',
        'site_id',
        'block',
        'position',
        'rate_label',
        'seeds_sown',
        'stand_counts_plants',
        `stand_row_length_${u.length}`,
        'tiller_plants',
        'tiller_count',
        'head_counts',
        `head_row_length_${u.length}`,
        `grain_weight_${u.weight}`,
        'harvest_rows',
        `harvest_length_${u.length}`,
        `harvest_area_${u.area}`,
        'moisture_pct',
        metric ? 'test_weight_kg_per_hl' : 'test_weight_lb_per_bu',
        'sowing_date',
        'emergence_date',
        'heading_date',
        'harvest_date',
        'notes',
        'updated_by',
        'updated_at',
      ],
      (strips as StripWithObservation[]).map((st) => {
        const o = st.observation;
        return [
          st.id,
          st.siteId,
          st.block,
          st.position,
          levelById.get(st.rateLevelId)?.label,
          o?.seedsSown,
          o?.standCounts?.join(' '),
          o?.standRowLength,
          o?.tillerPlants,
          o?.tillerCount,
          o?.headCounts?.join(' '),
          o?.headRowLength,
          o?.grainWeight,
          o?.harvestRows,
          o?.harvestLength,
          o?.harvestArea,
          o?.moisturePct,
          o?.testWeight,
          o?.sowingDate,
          o?.emergenceDate,
          o?.headingDate,
          o?.harvestDate,
          o?.notes,
          o?.updatedBy ? users.get(o.updatedBy)?.name : null,
          o?.updatedAt,
        ];
      }),
    );

    const photosCsv = toCsv(
      [
        'photo_id',
        'site_id',
        'strip_id',
        'original_name',
        'mime_type',
        'size_bytes',
        'caption',
        'uploaded_by',
        'uploaded_at',
      ],
      photos.map((p) => [
        p.id,
        p.siteId,
        p.stripId,
        p.originalName,
        p.mimeType,
        p.sizeBytes,
        p.caption,
        p.uploadedBy ? users.get(p.uploadedBy)?.name : null,
        p.createdAt,
      ]),
    );

    const auditCsv = toCsv(
      ['when', 'who', 'what', 'entity_type', 'entity_id', 'site_id', 'before_json', 'after_json'],
      audit.map((e) => [
        e.createdAt,
        e.actorUserId ? (users.get(e.actorUserId)?.name ?? null) : null,
        e.action,
        e.entityType,
        e.entityId,
        e.siteId,
        e.before ? JSON.stringify(e.before) : null,
        e.after ? JSON.stringify(e.after) : null,
      ]),
    );

    const files: [string, string][] = [
      ['README.txt', readme(trial, network?.name ?? '', u, metric)],
      ['trial.json', `${JSON.stringify(design, null, 2)}\n`],
      ['sites.csv', sitesCsv],
      ['layout.csv', layoutCsv],
      ['observations.csv', observationsCsv],
      ['photos.csv', photosCsv],
      ['audit.csv', auditCsv],
    ];
    const zip = new yazl.ZipFile();
    const stamp = new Date();
    for (const [name, text] of files)
      zip.addBuffer(Buffer.from(text, 'utf8'), name, { mtime: stamp });
    zip.end();
    const chunks: Buffer[] = [];
    for await (const chunk of zip.outputStream) chunks.push(chunk as Buffer);
    const slug =
      trial.name
        .toLowerCase()
        .replace(/[^a-z0-9]+/g, '-')
        .replace(/^-|-$/g, '') || 'trial';
    return { fileName: `${slug}-archive.zip`, zip: Buffer.concat(chunks) };
  }

  return { build };
}

function readme(
  trial: Trial,
  networkName: string,
  u: { length: string; weight: string; area: string },
  metric: boolean,
): string {
  return [
    `Sheaf trial archive: ${trial.name}${trial.season ? ` (${trial.season})` : ''}`,
    `Network: ${networkName}`,
    `Written: ${new Date().toISOString()} (UTC)`,
    '',
    'Every file is UTF-8. CSV files use commas, double quotes around cells that need them, and',
    'one header row. Times are UTC (ISO 8601); dates are YYYY-MM-DD. Cells that would start',
    'a spreadsheet formula carry a leading apostrophe.',
    '',
    'trial.json',
    '  The design: crop, season, status, reference rate and its unit, the rate levels',
    '  (multipliers of the reference rate), blocks per site, rows per strip, row spacing (in),',
    '  strip length (ft), border rows, seed lot figures (thousand-kernel weight in g,',
    '  germination and expected emergence in %), seed price per lb and grain price per bu.',
    '',
    'sites.csv',
    '  One row per site (one grower’s field). report_label is the neutral name ("Farm C") used',
    '  in network reports when named_in_reports is false. Holds growers’ names, e-mail',
    '  addresses, fertility and notes: keep this file within the network’s coordinators.',
    '  lost_reason is set when the site gave no harvest; packet_reissued_at when a design',
    '  amendment changed its seed weights after the packet went out.',
    '',
    'layout.csv',
    '  The randomized strip map: for each site, block and position, the rate level sown, the',
    '  seed to weigh out per strip (grams) and seeds per foot of row, from the current design.',
    '',
    'observations.csv',
    `  What growers recorded per strip, in the trial's ${metric ? 'metric' : 'imperial'} units`,
    `  (lengths in ${u.length}, weights in ${u.weight}, areas in ${u.area}; the unit is in each`,
    '  column name). stand_counts_plants and head_counts list the counts of each subsample of',
    '  row, separated by spaces, each taken on the row length in the next column. Empty cells',
    '  were not recorded.',
    '',
    'photos.csv',
    '  Metadata of the photos taken on the sites (the image files are not included): which site',
    '  and strip, the original file name, type, size in bytes, caption, who uploaded it and when.',
    '',
    'audit.csv',
    '  The history of the trial and its sites: when, who, what was done, and the values before',
    '  and after as JSON. Design amendments after sowing appear as "amend_design" with their',
    '  reason.',
    '',
    'All figures in the demo network are invented.',
    '',
  ].join('\n');
}
