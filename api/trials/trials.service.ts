// Trial design rules: create, read and change a trial, its rate levels and status; enrol sites.
import type { DataSource, EntityManager } from 'typeorm';
import { ZodError } from 'zod';
import type { Role } from '../../shared/schemas/common';
import type { CreateSiteInput } from '../../shared/schemas/site';
import {
  CompleteTrialDesignSchema,
  type CreateTrialInput,
  type NetworkPerson,
  type TrialDetail,
  type TrialStatus,
  type UpdateTrialInput,
} from '../../shared/schemas/trial';
import { RateLevelRow } from '../../db/entities/rate-level.entity';
import { Trial } from '../../db/entities/trial.entity';
import { recordAudit } from '../audit/audit.service';
import { Conflict, Forbidden, NotFound, ValidationError } from '../errors';
import type { InvitationsService } from '../invitations/invitations.service';
import { isCoordinating } from '../middleware/access';
import { SOWING_RECORDED_SQL } from '../lib/sowing-recorded';
import { presentSiteRow, presentTrial, type SiteRowQuery } from './trials.presenter';

const ALLOWED_STATUS_CHANGES: Record<TrialStatus, TrialStatus[]> = {
  draft: ['active'],
  active: ['closed'],
  closed: ['active'],
};

/** Column each design field is stored in. */
const COLUMNS = {
  name: 'name',
  question: 'question',
  crop: 'crop',
  customCrop: 'customCrop',
  season: 'season',
  unitSystem: 'unitSystem',
  referenceRate: 'referenceRate',
  referenceUnit: 'referenceUnit',
  blocksPerSite: 'blocksPerSite',
  rowsPerStrip: 'rowsPerStrip',
  rowSpacingIn: 'rowSpacingIn',
  stripLengthFt: 'stripLengthFt',
  borderRows: 'borderRows',
  thousandKernelWeightG: 'thousandKernelWeightG',
  germinationPct: 'germinationPct',
  emergencePct: 'emergencePct',
  seedPricePerLb: 'seedPricePerLb',
  grainPricePerBu: 'grainPricePerBu',
} as const satisfies Record<string, keyof Trial>;

export function createTrialsService(deps: {
  dataSource: DataSource;
  invitations: InvitationsService;
}) {
  const { dataSource, invitations } = deps;

  async function roleIn(
    networkId: string,
    userId: string,
    db: EntityManager = dataSource.manager,
  ): Promise<Role | undefined> {
    const rows: { role: Role }[] = await db.query(
      'SELECT role FROM memberships WHERE user_id = $1 AND network_id = $2',
      [userId, networkId],
    );
    return rows[0]?.role;
  }

  async function randomizedSiteCount(trialId: string, db: EntityManager): Promise<number> {
    const rows: { n: string }[] = await db.query(
      'SELECT count(*) AS n FROM sites WHERE trial_id = $1 AND randomized_at IS NOT NULL',
      [trialId],
    );
    return Number(rows[0]?.n ?? 0);
  }

  async function replaceLevels(
    db: EntityManager,
    trialId: string,
    levels: readonly { multiplier: number; label: string }[],
  ) {
    await db.query('DELETE FROM rate_levels WHERE trial_id = $1', [trialId]);
    const sorted = [...levels].sort((a, b) => a.multiplier - b.multiplier);
    for (const [i, level] of sorted.entries()) {
      await db.query(
        'INSERT INTO rate_levels (trial_id, position, multiplier, label) VALUES ($1, $2, $3, $4)',
        [trialId, i + 1, level.multiplier, level.label],
      );
    }
  }

  async function create(userId: string, input: CreateTrialInput): Promise<TrialDetail> {
    const role = await roleIn(input.networkId, userId);
    if (!role) throw new NotFound('Network');
    if (!isCoordinating(role))
      throw new Forbidden('Only a coordinator of this network can start a trial');
    const id = await dataSource.transaction(async (manager) => {
      const repo = manager.getRepository(Trial);
      const trial = repo.create({
        networkId: input.networkId,
        name: input.name,
        status: 'draft',
        createdBy: userId,
      });
      for (const [field, column] of Object.entries(COLUMNS)) {
        const value = (input as Record<string, unknown>)[field];
        if (value !== undefined) (trial as unknown as Record<string, unknown>)[column] = value;
      }
      const saved = await repo.save(trial);
      await replaceLevels(manager, saved.id, input.rateLevels ?? []);
      await recordAudit(manager, {
        actorUserId: userId,
        entityType: 'trial',
        entityId: saved.id,
        action: 'create',
        after: { ...input },
      });
      return saved.id;
    });
    return get(id, userId);
  }

  async function get(trialId: string, userId: string): Promise<TrialDetail> {
    const trial = await dataSource.getRepository(Trial).findOneBy({ id: trialId });
    if (!trial) throw new NotFound('Trial');
    const role = await roleIn(trial.networkId, userId);
    if (!role) throw new NotFound('Trial');
    const [network]: { name: string }[] = await dataSource.query(
      'SELECT name FROM networks WHERE id = $1',
      [trial.networkId],
    );
    const levels = await dataSource.getRepository(RateLevelRow).findBy({ trialId });
    const coordinating = isCoordinating(role);
    const siteRows: SiteRowQuery[] = await dataSource.query(
      `SELECT s.id, s.field_name, s.grower_user_id, u.name AS grower_name, COALESCE(u.email, s.grower_email) AS grower_email,
              (s.grower_user_id IS NULL AND s.grower_email IS NOT NULL) AS pending,
              s.randomized_at, to_char(s.sowing_date, 'YYYY-MM-DD') AS sowing_date, ${SOWING_RECORDED_SQL} AS sowing_recorded,
              (SELECT count(*) FROM strips st WHERE st.site_id = s.id) AS strip_count, s.published_at
         FROM sites s LEFT JOIN users u ON u.id = s.grower_user_id
        WHERE s.trial_id = $1 AND ($2::boolean OR s.grower_user_id = $3 OR s.published_at IS NOT NULL)
        ORDER BY s.created_at, s.field_name`,
      [trialId, coordinating, userId],
    );
    const [pooled]: { published_at: Date }[] = await dataSource.query(
      `SELECT published_at FROM report_snapshots WHERE trial_id = $1 AND scope = 'pooled' AND withdrawn_at IS NULL
        ORDER BY published_at DESC LIMIT 1`,
      [trialId],
    );
    const [counts]: { n: string; randomized: string }[] = await dataSource.query(
      'SELECT count(*) AS n, count(randomized_at) AS randomized FROM sites WHERE trial_id = $1',
      [trialId],
    );
    return {
      ...presentTrial(trial, {
        networkName: network?.name ?? '',
        levels,
        siteCount: Number(counts?.n ?? 0),
        pooledPublishedAt: pooled?.published_at ?? null,
      }),
      sites: siteRows.map(presentSiteRow),
      viewerRole: role,
      canEdit: coordinating,
      designLocked: Number(counts?.randomized ?? 0) > 0,
    };
  }

  async function update(
    trialId: string,
    userId: string,
    input: UpdateTrialInput,
  ): Promise<TrialDetail> {
    await dataSource.transaction(async (manager) => {
      const repo = manager.getRepository(Trial);
      const trial = await repo
        .createQueryBuilder('t')
        .setLock('pessimistic_write')
        .where('t.id = :id', { id: trialId })
        .getOne();
      if (!trial) throw new NotFound('Trial');
      const before = { ...trial } as Record<string, unknown>;
      const locked = (await randomizedSiteCount(trialId, manager)) > 0;
      if (locked && input.rateLevels !== undefined) {
        throw new Conflict(
          'Rate levels cannot change once a site is randomized: the strip maps already use them',
        );
      }
      if (
        locked &&
        input.blocksPerSite !== undefined &&
        input.blocksPerSite !== trial.blocksPerSite
      ) {
        throw new Conflict(
          'Blocks per site cannot change once a site is randomized: the strip maps already use them',
        );
      }
      for (const [field, column] of Object.entries(COLUMNS)) {
        const value = (input as Record<string, unknown>)[field];
        if (value !== undefined) (trial as unknown as Record<string, unknown>)[column] = value;
      }
      if (input.crop !== undefined && input.crop !== 'custom' && input.customCrop === undefined)
        trial.customCrop = null;
      if (input.status !== undefined && input.status !== trial.status) {
        if (!ALLOWED_STATUS_CHANGES[trial.status].includes(input.status)) {
          throw new Conflict(`A ${trial.status} trial cannot become ${input.status}`, {
            status: trial.status,
          });
        }
      }
      const nextStatus = input.status ?? trial.status;
      if (nextStatus !== 'draft') {
        // Going to (or staying in) the field needs the whole design; report every missing field.
        const levels =
          input.rateLevels ??
          (await manager.getRepository(RateLevelRow).findBy({ trialId })).map((l) => ({
            multiplier: l.multiplier,
            label: l.label,
          }));
        const candidate = Object.fromEntries(
          Object.entries({
            ...Object.fromEntries(
              Object.entries(COLUMNS).map(([f, c]) => [
                f,
                (trial as unknown as Record<string, unknown>)[c],
              ]),
            ),
            rateLevels: levels,
          }).filter(([, v]) => v !== null && v !== undefined),
        );
        const parsed = CompleteTrialDesignSchema.safeParse(candidate);
        if (!parsed.success) throw designIncomplete(parsed.error);
      }
      trial.status = nextStatus;
      await repo.save(trial);
      if (input.rateLevels !== undefined) await replaceLevels(manager, trialId, input.rateLevels);
      await recordAudit(manager, {
        actorUserId: userId,
        entityType: 'trial',
        entityId: trialId,
        action: 'update',
        before: pick(before, Object.keys(input)),
        after: { ...input },
      });
    });
    return get(trialId, userId);
  }

  async function enrolSite(trialId: string, userId: string, input: CreateSiteInput) {
    return dataSource.transaction(async (manager) => {
      const [trial]: { network_id: string; name: string; status: TrialStatus }[] =
        await manager.query('SELECT network_id, name, status FROM trials WHERE id = $1', [trialId]);
      if (!trial) throw new NotFound('Trial');
      if (trial.status === 'closed')
        throw new Conflict('This trial is closed: reopen it before enrolling sites');
      const inviterRole = (await roleIn(trial.network_id, userId, manager)) as Role;
      let growerUserId: string | null = null;
      let growerEmail: string | null = null;
      if (input.growerUserId) {
        const role = await roleIn(trial.network_id, input.growerUserId, manager);
        if (!role)
          throw new ValidationError('That person is not in this network', {
            growerUserId: 'not a member of this network',
          });
        growerUserId = input.growerUserId;
      } else if (input.growerEmail) {
        const [user]: { id: string }[] = await manager.query(
          'SELECT id FROM users WHERE email = $1',
          [input.growerEmail],
        );
        if (user) {
          const role = await roleIn(trial.network_id, user.id, manager);
          if (!role) {
            throw new ValidationError(
              'That address has a Sheaf account outside this network: invite them to the network first',
              {
                growerEmail: 'has an account that is not in this network',
              },
            );
          }
          growerUserId = user.id;
        } else {
          growerEmail = input.growerEmail;
        }
      }
      const [site]: { id: string }[] = await manager.query(
        `INSERT INTO sites (trial_id, grower_user_id, grower_email, field_name, soil, previous_crop, fertility, notes)
         VALUES ($1, $2, $3, $4, $5, $6, $7, $8) RETURNING id`,
        [
          trialId,
          growerUserId,
          growerEmail,
          input.fieldName,
          input.soil,
          input.previousCrop,
          input.fertility,
          input.notes,
        ],
      );
      await recordAudit(manager, {
        actorUserId: userId,
        entityType: 'site',
        entityId: site!.id,
        siteId: site!.id,
        action: 'create',
        after: { ...input },
      });
      let invitation: { id: string; email: string } | null = null;
      if (growerEmail) {
        const created = await invitations.invite({
          networkId: trial.network_id,
          email: growerEmail,
          role: 'grower',
          invitedBy: userId,
          inviterRole,
          siteId: site!.id,
          trialName: trial.name,
          manager,
        });
        invitation = { id: created.id, email: created.email };
      }
      return { siteId: site!.id, invitation };
    });
  }

  /** Members of the trial's network a coordinator can enrol as growers (growers first). */
  async function people(trialId: string): Promise<NetworkPerson[]> {
    const rows: { id: string; name: string; email: string; role: Role }[] = await dataSource.query(
      `SELECT u.id, u.name, u.email, m.role FROM trials t
         JOIN memberships m ON m.network_id = t.network_id JOIN users u ON u.id = m.user_id
        WHERE t.id = $1 ORDER BY (m.role = 'grower') DESC, u.name`,
      [trialId],
    );
    return rows.map((r) => ({ userId: r.id, name: r.name, email: r.email, role: r.role }));
  }

  return { create, get, update, enrolSite, people };
}

function pick(source: Record<string, unknown>, keys: string[]): Record<string, unknown> {
  return Object.fromEntries(keys.filter((k) => k in source).map((k) => [k, source[k]]));
}

function designIncomplete(error: ZodError): ValidationError {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.map(String).join('.') : '_';
    fields[key] ??=
      issue.code === 'invalid_type' && issue.input === undefined
        ? 'Needed before the trial goes to the field'
        : issue.message;
  }
  return new ValidationError(
    `Finish the design before the trial goes to the field: ${Object.keys(fields).join(', ')}`,
    fields,
  );
}

export type TrialsService = ReturnType<typeof createTrialsService>;
