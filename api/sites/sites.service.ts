// Site rules: the site detail with its trial's design, RCBD randomization, the strip layout with
// seed weights, and the seeder calibrations a grower records.
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/schemas/common';
import type { Layout } from '../../shared/schemas/layout';
import type { CalibrationInput, CalibrationRecordDto, SiteDetail } from '../../shared/schemas/site';
import type { CustomCrop } from '../../shared/schemas/trial';
import { newRandomizationSeed } from '../../shared/design/randomize-rcbd';
import { randomizeSite } from '../../shared/design/randomize-site';
import { rateTable } from '../../shared/design/rate-table';
import { calibrateSeeder } from '../../shared/units/calibration';
import { CROPS, type CropKey } from '../../shared/units/crops';
import { recordAudit } from '../audit/audit.service';
import { Conflict, Locked, NotFound } from '../errors';
import { isCoordinating } from '../middleware/access';
import { SOWING_RECORDED_SQL } from '../trials/trials.presenter';
import { farmLabel } from '../privacy/site-names';

interface SiteRow {
  id: string;
  trial_id: string;
  network_id: string;
  network_name: string;
  field_name: string;
  soil: string;
  previous_crop: string;
  fertility: string;
  notes: string;
  grower_user_id: string | null;
  grower_name: string | null;
  grower_email: string | null;
  pending: boolean;
  sowing_date: string | null;
  emergence_date: string | null;
  heading_date: string | null;
  harvest_date: string | null;
  randomization_seed: string | null;
  randomized_at: Date | null;
  sowing_recorded: boolean;
  strip_count: string;
  calibrations: CalibrationRecordDto[];
  published_at: Date | null;
  data_version: number;
  named_in_reports: boolean;
  report_number: number;
  lost_reason: string | null;
  packet_reissued_at: Date | null;
  created_at: Date;
  updated_at: Date;
}

interface TrialRow {
  id: string;
  name: string;
  status: 'draft' | 'in-field' | 'harvest-in' | 'closed';
  crop: string | null;
  custom_crop: CustomCrop | null;
  season: string | null;
  unit_system: 'imperial' | 'metric';
  reference_rate: string | null;
  reference_unit: string | null;
  blocks_per_site: number | null;
  rows_per_strip: number | null;
  row_spacing_in: string | null;
  strip_length_ft: string | null;
  border_rows: number | null;
  thousand_kernel_weight_g: string | null;
  germination_pct: string | null;
  emergence_pct: string | null;
}

const num = (v: string | number | null) => (v === null ? null : Number(v));

export function createSitesService(deps: { dataSource: DataSource }) {
  const { dataSource } = deps;

  async function siteRow(siteId: string): Promise<SiteRow> {
    const [row]: SiteRow[] = await dataSource.query(
      `SELECT s.id, s.trial_id, t.network_id, n.name AS network_name, s.field_name, s.soil, s.previous_crop, s.fertility, s.notes,
              s.grower_user_id, u.name AS grower_name, COALESCE(u.email, s.grower_email) AS grower_email,
              (s.grower_user_id IS NULL AND s.grower_email IS NOT NULL) AS pending,
              to_char(s.sowing_date, 'YYYY-MM-DD') AS sowing_date, to_char(s.emergence_date, 'YYYY-MM-DD') AS emergence_date,
              to_char(s.heading_date, 'YYYY-MM-DD') AS heading_date, to_char(s.harvest_date, 'YYYY-MM-DD') AS harvest_date,
              s.randomization_seed, s.randomized_at, ${SOWING_RECORDED_SQL} AS sowing_recorded,
              (SELECT count(*) FROM strips st WHERE st.site_id = s.id) AS strip_count,
              s.calibrations, s.published_at, s.data_version, s.created_at, s.updated_at,
              s.named_in_reports, s.report_number, s.lost_reason, s.packet_reissued_at
         FROM sites s JOIN trials t ON t.id = s.trial_id JOIN networks n ON n.id = t.network_id
         LEFT JOIN users u ON u.id = s.grower_user_id
        WHERE s.id = $1`,
      [siteId],
    );
    if (!row) throw new NotFound('Site');
    return row;
  }

  async function trialContext(trialId: string): Promise<SiteDetail['trial']> {
    const [t]: TrialRow[] = await dataSource.query('SELECT * FROM trials WHERE id = $1', [trialId]);
    if (!t) throw new NotFound('Trial');
    const levels: { id: string; multiplier: string; label: string }[] = await dataSource.query(
      'SELECT id, multiplier, label FROM rate_levels WHERE trial_id = $1 ORDER BY multiplier',
      [trialId],
    );
    const cropName =
      t.crop === 'custom'
        ? (t.custom_crop?.name ?? 'Custom crop')
        : t.crop
          ? (CROPS[t.crop as CropKey]?.name ?? t.crop)
          : null;
    return {
      id: t.id,
      name: t.name,
      status: t.status,
      crop: t.crop,
      cropName,
      season: t.season,
      unitSystem: t.unit_system,
      referenceRate: num(t.reference_rate),
      referenceUnit: t.reference_unit,
      blocksPerSite: t.blocks_per_site,
      rowsPerStrip: t.rows_per_strip,
      rowSpacingIn: num(t.row_spacing_in),
      stripLengthFt: num(t.strip_length_ft),
      borderRows: t.border_rows,
      thousandKernelWeightG: num(t.thousand_kernel_weight_g),
      germinationPct: num(t.germination_pct),
      emergencePct: num(t.emergence_pct),
      rateLevels: levels.map((l) => ({
        id: l.id,
        multiplier: Number(l.multiplier),
        label: l.label,
      })),
    };
  }

  async function viewerRole(networkId: string, userId: string): Promise<Role> {
    const [row]: { role: Role }[] = await dataSource.query(
      'SELECT role FROM memberships WHERE user_id = $1 AND network_id = $2',
      [userId, networkId],
    );
    if (!row) throw new NotFound('Site');
    return row.role;
  }

  async function get(siteId: string, userId: string): Promise<SiteDetail> {
    const row = await siteRow(siteId);
    const role = await viewerRole(row.network_id, userId);
    const isGrower = row.grower_user_id === userId;
    return {
      id: row.id,
      trialId: row.trial_id,
      networkId: row.network_id,
      networkName: row.network_name,
      trial: await trialContext(row.trial_id),
      fieldName: row.field_name,
      soil: row.soil,
      previousCrop: row.previous_crop,
      fertility: row.fertility,
      notes: row.notes,
      grower: {
        userId: row.grower_user_id,
        name: row.grower_name,
        email: row.grower_email,
        invitationPending: row.pending,
      },
      sowingDate: row.sowing_date,
      emergenceDate: row.emergence_date,
      headingDate: row.heading_date,
      harvestDate: row.harvest_date,
      randomized: row.randomized_at !== null,
      randomizationSeed: row.randomization_seed,
      randomizedAt: row.randomized_at ? new Date(row.randomized_at).toISOString() : null,
      sowingRecorded: row.sowing_recorded,
      stripCount: Number(row.strip_count),
      calibrations: row.calibrations ?? [],
      publishedAt: row.published_at ? new Date(row.published_at).toISOString() : null,
      dataVersion: row.data_version,
      viewerRole: role,
      isGrower,
      namedInReports: row.named_in_reports,
      reportLabel: farmLabel(row.report_number),
      lostReason: row.lost_reason,
      packetReissuedAt: row.packet_reissued_at
        ? new Date(row.packet_reissued_at).toISOString()
        : null,
      canCoordinate: isCoordinating(role),
      createdAt: new Date(row.created_at).toISOString(),
      updatedAt: new Date(row.updated_at).toISOString(),
    };
  }

  /** Draws the site's RCBD map from `seed` (or a new one) and replaces its strips. */
  async function randomize(siteId: string, userId: string, seed?: string): Promise<Layout> {
    await dataSource.transaction(async (manager) => {
      const [site]: {
        id: string;
        trial_id: string;
        published_at: Date | null;
        sowing_recorded: boolean;
      }[] = await manager.query(
        `SELECT s.id, s.trial_id, s.published_at, ${SOWING_RECORDED_SQL} AS sowing_recorded FROM sites s WHERE s.id = $1 FOR UPDATE`,
        [siteId],
      );
      if (!site) throw new NotFound('Site');
      if (site.published_at)
        throw new Locked('This site’s report is published: its strip map is final');
      if (site.sowing_recorded) {
        throw new Conflict(
          'Sowing is already recorded for this site (a sowing date or strip data), so its strip map can no longer be re-randomized',
        );
      }
      const [trial]: { status: string; blocks_per_site: number | null }[] = await manager.query(
        'SELECT status, blocks_per_site FROM trials WHERE id = $1',
        [site.trial_id],
      );
      if (!trial || trial.status !== 'in-field') {
        throw new Conflict(
          'Finish the trial design first: strips are randomized once the trial is in the field',
        );
      }
      const levels: { id: string }[] = await manager.query(
        'SELECT id FROM rate_levels WHERE trial_id = $1 ORDER BY position',
        [site.trial_id],
      );
      const blocks = trial.blocks_per_site ?? 0;
      if (levels.length < 2 || blocks < 1)
        throw new Conflict('The trial needs at least 2 rate levels and 1 block before randomizing');
      const useSeed = seed ?? newRandomizationSeed();
      const map = randomizeSite(
        levels.map((l) => l.id),
        blocks,
        useSeed,
      );
      await manager.query('DELETE FROM strips WHERE site_id = $1', [siteId]);
      for (const [b, order] of map.entries()) {
        for (const [p, levelId] of order.entries()) {
          await manager.query(
            'INSERT INTO strips (site_id, block, position, rate_level_id) VALUES ($1, $2, $3, $4)',
            [siteId, b + 1, p + 1, levelId],
          );
        }
      }
      await manager.query(
        'UPDATE sites SET randomization_seed = $2, randomized_at = now(), data_version = data_version + 1, updated_at = now() WHERE id = $1',
        [siteId, useSeed],
      );
      await recordAudit(manager, {
        actorUserId: userId,
        entityType: 'site',
        entityId: siteId,
        siteId,
        action: 'randomize',
        after: { seed: useSeed },
      });
    });
    return layout(siteId);
  }

  async function layout(siteId: string): Promise<Layout> {
    const [site]: {
      trial_id: string;
      randomization_seed: string | null;
      randomized_at: Date | null;
    }[] = await dataSource.query(
      'SELECT trial_id, randomization_seed, randomized_at FROM sites WHERE id = $1',
      [siteId],
    );
    if (!site) throw new NotFound('Site');
    const trial = await trialContext(site.trial_id);
    const amounts = new Map(
      rateTable({ ...trial, rateLevels: trial.rateLevels }).map((r) => [r.rateLevelId, r] as const),
    );
    const strips: {
      id: string;
      block: number;
      position: number;
      rate_level_id: string;
      multiplier: string;
      label: string;
    }[] = await dataSource.query(
      `SELECT st.id, st.block, st.position, st.rate_level_id, rl.multiplier, rl.label
           FROM strips st JOIN rate_levels rl ON rl.id = st.rate_level_id
          WHERE st.site_id = $1 ORDER BY st.block, st.position`,
      [siteId],
    );
    const blocks = new Map<number, Layout['blocks'][number]>();
    for (const s of strips) {
      const amount = amounts.get(s.rate_level_id);
      let block = blocks.get(s.block);
      if (!block) {
        block = { block: s.block, strips: [] };
        blocks.set(s.block, block);
      }
      block.strips.push({
        stripId: s.id,
        position: s.position,
        rateLevelId: s.rate_level_id,
        rate: Number(s.multiplier),
        label: s.label,
        seedGrams: amount ? Math.round(amount.gramsPerStrip * 10) / 10 : 0,
        seedsPerFootOfRow: amount ? Math.round(amount.seedsPerFootOfRow * 100) / 100 : null,
      });
    }
    return {
      siteId,
      seed: site.randomization_seed ?? '',
      randomizedAt: site.randomized_at ? new Date(site.randomized_at).toISOString() : null,
      blocks: [...blocks.values()],
    };
  }

  async function addCalibration(
    siteId: string,
    userId: string,
    input: CalibrationInput,
  ): Promise<CalibrationRecordDto[]> {
    const result = calibrateSeeder({
      seedsCounted: input.seedsCounted,
      wheelTurns: input.turns,
      circumferenceFeet: input.wheelCircumferenceFt,
      rowSpacingInches: input.rowSpacingIn,
      targetSeedsPerFootOfRow: input.targetSeedsPerFt,
    });
    const record: CalibrationRecordDto = {
      recordedAt: new Date().toISOString(),
      recordedBy: userId,
      wheelCircumferenceFt: input.wheelCircumferenceFt,
      turns: input.turns,
      seedsCounted: input.seedsCounted,
      targetSeedsPerFt: input.targetSeedsPerFt,
      deliveredSeedsPerFt: Math.round(result.deliveredSeedsPerFootOfRow * 100) / 100,
      percentOfTarget: Math.round(result.percentOfTarget * 10) / 10,
      rateLabel: input.rateLabel,
      note: input.note,
    };
    return dataSource.transaction(async (manager) => {
      const [row]: { calibrations: CalibrationRecordDto[]; published_at: Date | null }[] =
        await manager.query(
          'SELECT calibrations, published_at FROM sites WHERE id = $1 FOR UPDATE',
          [siteId],
        );
      if (!row) throw new NotFound('Site');
      if (row.published_at)
        throw new Locked('This site’s report is published: its records are read-only');
      const next = [...(row.calibrations ?? []), record];
      await manager.query(
        'UPDATE sites SET calibrations = $2::jsonb, updated_at = now() WHERE id = $1',
        [siteId, JSON.stringify(next)],
      );
      await recordAudit(manager, {
        actorUserId: userId,
        entityType: 'site',
        entityId: siteId,
        siteId,
        action: 'calibrate',
        after: { ...record },
      });
      return next;
    });
  }

  return { get, randomize, layout, addCalibration };
}

export type SitesService = ReturnType<typeof createSitesService>;
