// Trial design rules: create, read and change a trial, its rate levels and its life (draft →
// in the field → harvest in → closed); delete a draft; enrol sites; amend a sown design.
import { IsNull, type DataSource, type EntityManager } from 'typeorm';
import { ZodError } from 'zod';
import type { Role } from '../../shared/schemas/common';
import type { CreateSiteInput } from '../../shared/schemas/site';
import {
  CompleteTrialDesignSchema,
  SEED_WEIGHT_FIELDS,
  type CreateTrialInput,
  type DesignAmendment,
  type NetworkPerson,
  type TrialDetail,
  type TrialStatus,
  type UpdateTrialInput,
} from '../../shared/schemas/trial';
import { AuditEvent } from '../../db/entities/audit-event.entity';
import { Membership } from '../../db/entities/membership.entity';
import { Network } from '../../db/entities/network.entity';
import { RateLevelRow } from '../../db/entities/rate-level.entity';
import { ReportSnapshot } from '../../db/entities/report-snapshot.entity';
import { Site } from '../../db/entities/site.entity';
import { Trial } from '../../db/entities/trial.entity';
import { User } from '../../db/entities/user.entity';
import { recordAudit } from '../audit/audit.service';
import { AppError, Conflict, Forbidden, Locked, NotFound, ValidationError } from '../errors';
import type { InvitationsService } from '../invitations/invitations.service';
import { composeMail, type Mailer } from '../mail/mailer';
import { isCoordinating } from '../middleware/access';
import { SOWING_RECORDED_SQL } from '../lib/sowing-recorded';
import { seesPrivateDetails, siteNameFor } from '../lib/site-names';
import { presentSiteRow, presentTrial, type SiteRowQuery } from './trials.presenter';

/** Stored status changes a coordinator may ask for; "harvest-in" follows from the data. */
const ALLOWED_STATUS_CHANGES: Record<TrialStatus, TrialStatus[]> = {
  draft: ['in-field'],
  'in-field': ['closed'],
  'harvest-in': ['closed'],
  closed: ['in-field'],
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

const FIELD_WORDS: Record<string, string> = {
  referenceRate: 'reference rate',
  referenceUnit: 'reference rate unit',
  thousandKernelWeightG: 'thousand-kernel weight',
  germinationPct: 'germination',
  emergencePct: 'expected emergence',
  rowsPerStrip: 'rows per strip',
  rowSpacingIn: 'row spacing',
  stripLengthFt: 'strip length',
};

/** SQL true when site `s` has at least one strip with a threshed grain weight. */
const HAS_YIELD_SQL = `EXISTS (SELECT 1 FROM strips st JOIN observations o ON o.strip_id = st.id
  WHERE st.site_id = s.id AND o.grain_weight IS NOT NULL)`;

// Counts over a trial's sites, built once from fixed SQL fragments (no input reaches them).
const WITH_YIELD_COUNT = `count(*) FILTER (WHERE ${HAS_YIELD_SQL})::int`;
const HARVESTED_COUNT = `count(*) FILTER (WHERE ${HAS_YIELD_SQL} OR s.lost_reason IS NOT NULL)::int`;
const SOWN_COUNT = `count(*) FILTER (WHERE ${SOWING_RECORDED_SQL})::int`;

export function designLockedError(fields: string[]): AppError {
  return new AppError(
    409,
    'design_locked',
    `Sowing has started, so ${fields.map((f) => FIELD_WORDS[f] ?? f).join(', ')} can change only as an amendment: say why in amendReason`,
    { fields: Object.fromEntries(fields.map((f) => [f, 'locked once a site is sown'])) },
  );
}

export function createTrialsService(deps: {
  dataSource: DataSource;
  invitations: InvitationsService;
  mailer?: Mailer;
  publicUrl?: string;
}) {
  const { dataSource, invitations } = deps;

  async function roleIn(
    networkId: string,
    userId: string,
    db: EntityManager = dataSource.manager,
  ): Promise<Role | undefined> {
    const row = await db.getRepository(Membership).findOneBy({ userId, networkId });
    return row?.role;
  }

  function sitesOf(db: EntityManager, trialId: string) {
    return db
      .getRepository(Site)
      .createQueryBuilder('s')
      .where('s.trial_id = :trialId', { trialId });
  }

  async function replaceLevels(
    db: EntityManager,
    trialId: string,
    levels: readonly { multiplier: number; label: string }[],
  ) {
    const repo = db.getRepository(RateLevelRow);
    await repo.delete({ trialId });
    const sorted = [...levels].sort((a, b) => a.multiplier - b.multiplier);
    if (sorted.length === 0) return;
    await repo.insert(
      sorted.map((level, i) => ({
        trialId,
        position: i + 1,
        multiplier: level.multiplier,
        label: level.label,
      })),
    );
  }

  /** Sites, sites with a yield and sites marked lost; "harvest in" when every site is one or the other. */
  async function harvestOf(db: EntityManager, trialId: string) {
    const row = await sitesOf(db, trialId)
      .select('count(*)::int', 'sites')
      .addSelect(WITH_YIELD_COUNT, 'withYield')
      .addSelect('count(*) FILTER (WHERE s.lost_reason IS NOT NULL)::int', 'lost')
      .addSelect(HARVESTED_COUNT, 'done')
      .addSelect('count(s.randomized_at)::int', 'randomized')
      .addSelect(SOWN_COUNT, 'sown')
      .getRawOne<{
        sites: number;
        withYield: number;
        lost: number;
        done: number;
        randomized: number;
        sown: number;
      }>();
    return row ?? { sites: 0, withYield: 0, lost: 0, done: 0, randomized: 0, sown: 0 };
  }

  function effectiveStatus(stored: TrialStatus, harvest: { sites: number; done: number }) {
    if (stored === 'in-field' && harvest.sites > 0 && harvest.done === harvest.sites)
      return 'harvest-in' as const;
    return stored;
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
    const db = dataSource.manager;
    const trial = await db.getRepository(Trial).findOneBy({ id: trialId });
    if (!trial) throw new NotFound('Trial');
    const role = await roleIn(trial.networkId, userId);
    if (!role) throw new NotFound('Trial');
    const coordinating = isCoordinating(role);
    const [network, levels, siteRows, pooled, harvest] = await Promise.all([
      db.getRepository(Network).findOneBy({ id: trial.networkId }),
      db.getRepository(RateLevelRow).findBy({ trialId }),
      sitesOf(db, trialId)
        .leftJoin(User, 'u', 'u.id = s.grower_user_id')
        .select('s.id', 'id')
        .addSelect('s.field_name', 'field_name')
        .addSelect('s.grower_user_id', 'grower_user_id')
        .addSelect('u.name', 'grower_name')
        .addSelect('COALESCE(u.email, s.grower_email)', 'grower_email')
        .addSelect('(s.grower_user_id IS NULL AND s.grower_email IS NOT NULL)', 'pending')
        .addSelect('s.randomized_at', 'randomized_at')
        .addSelect(`to_char(s.sowing_date, 'YYYY-MM-DD')`, 'sowing_date')
        .addSelect(SOWING_RECORDED_SQL, 'sowing_recorded')
        .addSelect('(SELECT count(*) FROM strips st WHERE st.site_id = s.id)', 'strip_count')
        .addSelect('s.published_at', 'published_at')
        .addSelect('s.named_in_reports', 'named_in_reports')
        .addSelect('s.report_number', 'report_number')
        .addSelect('s.lost_reason', 'lost_reason')
        .addSelect('s.packet_reissued_at', 'packet_reissued_at')
        .addSelect(HAS_YIELD_SQL, 'has_yield')
        .andWhere('(:coordinating OR s.grower_user_id = :userId OR s.published_at IS NOT NULL)', {
          coordinating,
          userId,
        })
        .orderBy('s.created_at')
        .addOrderBy('s.field_name')
        .getRawMany<SiteRowQuery>(),
      db.getRepository(ReportSnapshot).findOne({
        where: { trialId, scope: 'pooled', withdrawnAt: IsNull() },
        order: { publishedAt: 'DESC' },
      }),
      harvestOf(db, trialId),
    ]);
    const viewer = { userId, role };
    const status = effectiveStatus(trial.status, harvest);
    const sowingStarted = harvest.sown > 0;
    return {
      ...presentTrial(trial, {
        networkName: network?.name ?? '',
        levels,
        siteCount: harvest.sites,
        pooledPublishedAt: pooled?.publishedAt ?? null,
      }),
      status,
      sites: siteRows.map((row) => {
        const site = {
          fieldName: row.field_name,
          growerUserId: row.grower_user_id,
          namedInReports: row.named_in_reports,
          reportNumber: row.report_number,
        };
        const full = seesPrivateDetails(site, viewer);
        return presentSiteRow({
          ...row,
          field_name: siteNameFor(site, viewer),
          grower_name: full || row.named_in_reports ? row.grower_name : null,
          grower_email: full ? row.grower_email : null,
          lost_reason: full ? row.lost_reason : row.lost_reason === null ? null : 'Lost',
        });
      }),
      viewerRole: role,
      // The public link opens the pooled report to anyone who has it: coordinators only.
      publicLinkToken: coordinating ? trial.publicLinkToken : null,
      canEdit: coordinating && trial.status !== 'closed',
      designLocked: harvest.randomized > 0,
      sowingStarted,
      lockedFields: sowingStarted ? [...SEED_WEIGHT_FIELDS] : [],
      harvest: { sites: harvest.sites, withYield: harvest.withYield, lost: harvest.lost },
      closedAt: trial.closedAt ? new Date(trial.closedAt).toISOString() : null,
      canDelete: coordinating && trial.status === 'draft',
    };
  }

  async function update(
    trialId: string,
    userId: string,
    input: UpdateTrialInput,
  ): Promise<TrialDetail> {
    const mails: { to: string; name: string | null; field: string }[] = [];
    let trialName = '';
    let reason = '';
    await dataSource.transaction(async (manager) => {
      const repo = manager.getRepository(Trial);
      const trial = await repo
        .createQueryBuilder('t')
        .setLock('pessimistic_write')
        .where('t.id = :id', { id: trialId })
        .getOne();
      if (!trial) throw new NotFound('Trial');
      trialName = trial.name;
      const { status: wanted, amendReason, ...design } = input;
      const changingDesign = Object.keys(design).length > 0;
      if (trial.status === 'closed' && (changingDesign || wanted !== 'in-field')) {
        throw new Locked('This trial is closed and read-only: reopen it to change anything');
      }
      const before = { ...trial } as Record<string, unknown>;
      const harvest = await harvestOf(manager, trialId);
      const randomized = harvest.randomized > 0;
      if (randomized && design.rateLevels !== undefined) {
        throw new Conflict(
          'Rate levels cannot change once a site is randomized: the strip maps already use them',
        );
      }
      if (
        randomized &&
        design.blocksPerSite !== undefined &&
        design.blocksPerSite !== trial.blocksPerSite
      ) {
        throw new Conflict(
          'Blocks per site cannot change once a site is randomized: the strip maps already use them',
        );
      }
      const seedChanges = SEED_WEIGHT_FIELDS.filter(
        (f) => design[f] !== undefined && design[f] !== trial[COLUMNS[f]],
      );
      const amending = harvest.sown > 0 && seedChanges.length > 0;
      if (amending && !amendReason) throw designLockedError(seedChanges);
      for (const [field, column] of Object.entries(COLUMNS)) {
        const value = (design as Record<string, unknown>)[field];
        if (value !== undefined) (trial as unknown as Record<string, unknown>)[column] = value;
      }
      if (design.crop !== undefined && design.crop !== 'custom' && design.customCrop === undefined)
        trial.customCrop = null;
      const current = effectiveStatus(trial.status, harvest);
      if (wanted !== undefined && wanted !== trial.status && wanted !== current) {
        if (wanted === 'harvest-in') {
          throw new Conflict(
            'A trial is “harvest in” by itself once every site has a yield or is marked lost',
            { status: current },
          );
        }
        if (!ALLOWED_STATUS_CHANGES[trial.status].includes(wanted)) {
          throw new Conflict(`A ${trial.status} trial cannot become ${wanted}`, {
            status: current,
          });
        }
        if (wanted === 'closed' && current !== 'harvest-in') {
          throw new Conflict(
            `Close the trial once the harvest is in: ${harvest.sites - harvest.done} of ${harvest.sites} sites have no yield and are not marked lost`,
            { status: current, harvest },
          );
        }
      }
      const nextStatus = wanted === 'harvest-in' ? trial.status : (wanted ?? trial.status);
      if (nextStatus !== 'draft') {
        // Going to (or staying in) the field needs the whole design; report every missing field.
        const levels =
          design.rateLevels ??
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
      if (nextStatus === 'closed' && trial.status !== 'closed') trial.closedAt = new Date();
      if (nextStatus !== 'closed') trial.closedAt = null;
      const statusChanged = nextStatus !== trial.status;
      trial.status = nextStatus;
      await repo.save(trial);
      if (design.rateLevels !== undefined) await replaceLevels(manager, trialId, design.rateLevels);
      if (amending) {
        reason = amendReason!;
        const affected = await sitesOf(manager, trialId)
          .leftJoin(User, 'u', 'u.id = s.grower_user_id')
          .select('s.id', 'id')
          .addSelect('s.field_name', 'field')
          .addSelect('u.name', 'name')
          .addSelect('COALESCE(u.email, s.grower_email)', 'email')
          .andWhere('s.randomized_at IS NOT NULL')
          .getRawMany<{ id: string; field: string; name: string | null; email: string | null }>();
        if (affected.length > 0) {
          // Seed weights and establishment figures change: reports and packets must recompute.
          await manager
            .createQueryBuilder()
            .update(Site)
            .set({ packetReissuedAt: () => 'now()', dataVersion: () => 'data_version + 1' })
            .whereInIds(affected.map((a) => a.id))
            .execute();
        }
        for (const a of affected)
          if (a.email) mails.push({ to: a.email, name: a.name, field: a.field });
        await recordAudit(manager, {
          actorUserId: userId,
          entityType: 'trial',
          entityId: trialId,
          action: 'amend_design',
          before: pick(before, seedChanges),
          after: {
            ...Object.fromEntries(seedChanges.map((f) => [f, design[f]])),
            reason: amendReason,
            reissuedSites: affected.length,
          },
        });
      }
      const otherKeys = Object.keys(design).filter(
        (k) => !amending || !(SEED_WEIGHT_FIELDS as readonly string[]).includes(k),
      );
      if (otherKeys.length > 0 || statusChanged) {
        await recordAudit(manager, {
          actorUserId: userId,
          entityType: 'trial',
          entityId: trialId,
          action: statusChanged ? 'status_changed' : 'update',
          before: {
            ...pick(before, otherKeys),
            ...(statusChanged ? { status: before.status } : {}),
          },
          after: {
            ...pick(design as Record<string, unknown>, otherKeys),
            ...(statusChanged ? { status: nextStatus } : {}),
          },
        });
      }
    });
    await mailAmendment(trialId, trialName, reason, mails);
    return get(trialId, userId);
  }

  async function mailAmendment(
    trialId: string,
    trialName: string,
    reason: string,
    mails: { to: string; name: string | null; field: string }[],
  ) {
    if (!deps.mailer || mails.length === 0) return;
    const base = (deps.publicUrl ?? '').replace(/\/$/, '');
    for (const m of mails) {
      await deps.mailer.send(
        composeMail({
          to: m.to,
          subject: `The design of “${trialName}” changed: weigh your seed again`,
          paragraphs: [
            m.name ? `Hello ${m.name},` : 'Hello,',
            `The coordinator amended the design of “${trialName}” after sowing had started. The reason given: ${reason}`,
            `The seed weights in your field packet for ${m.field} have changed, so the packet is re-issued. If you have not sown every strip yet, weigh the seed again from the new packet; if you have, nothing needs doing: your data stay as they are.`,
          ],
          link: { label: 'Open the re-issued packet', url: `${base}/trials/${trialId}` },
        }),
      );
    }
  }

  async function remove(trialId: string, userId: string): Promise<void> {
    await dataSource.transaction(async (manager) => {
      const repo = manager.getRepository(Trial);
      const trial = await repo
        .createQueryBuilder('t')
        .setLock('pessimistic_write')
        .where('t.id = :id', { id: trialId })
        .getOne();
      if (!trial) throw new NotFound('Trial');
      if (trial.status !== 'draft') {
        throw new Conflict(
          'Only a draft can be deleted; close a trial that went to the field instead',
          { status: trial.status },
        );
      }
      await repo.delete({ id: trialId });
      await recordAudit(manager, {
        actorUserId: userId,
        entityType: 'trial',
        entityId: trialId,
        action: 'delete',
        before: { name: trial.name, networkId: trial.networkId, season: trial.season },
      });
    });
  }

  async function amendments(trialId: string): Promise<DesignAmendment[]> {
    const rows = await dataSource
      .getRepository(AuditEvent)
      .createQueryBuilder('a')
      .leftJoin(User, 'u', 'u.id = a.actor_user_id')
      .select('a.id', 'id')
      .addSelect('a.created_at', 'at')
      .addSelect('u.name', 'by_name')
      .addSelect('a.before', 'before')
      .addSelect('a.after', 'after')
      .where('a.entity_type = :type AND a.entity_id = :trialId AND a.action = :action', {
        type: 'trial',
        trialId,
        action: 'amend_design',
      })
      .orderBy('a.created_at', 'ASC')
      .getRawMany<{
        id: string;
        at: Date;
        by_name: string | null;
        before: Record<string, unknown> | null;
        after: Record<string, unknown> | null;
      }>();
    return rows.map((r) => {
      const after = r.after ?? {};
      return {
        id: r.id,
        at: new Date(r.at).toISOString(),
        byName: r.by_name,
        reason: String(after.reason ?? ''),
        changes: Object.keys(after)
          .filter((k) => k !== 'reason' && k !== 'reissuedSites')
          .map((field) => ({ field, from: r.before?.[field] ?? null, to: after[field] })),
        reissuedSites: Number(after.reissuedSites ?? 0),
      };
    });
  }

  async function enrolSite(trialId: string, userId: string, input: CreateSiteInput) {
    return dataSource.transaction(async (manager) => {
      const trial = await manager.getRepository(Trial).findOneBy({ id: trialId });
      if (!trial) throw new NotFound('Trial');
      if (trial.status === 'closed')
        throw new Conflict('This trial is closed: reopen it before enrolling sites');
      const inviterRole = (await roleIn(trial.networkId, userId, manager)) as Role;
      let growerUserId: string | null = null;
      let growerEmail: string | null = null;
      if (input.growerUserId) {
        const role = await roleIn(trial.networkId, input.growerUserId, manager);
        if (!role)
          throw new ValidationError('That person is not in this network', {
            growerUserId: 'not a member of this network',
          });
        growerUserId = input.growerUserId;
      } else if (input.growerEmail) {
        const user = await manager.getRepository(User).findOneBy({ email: input.growerEmail });
        // An account outside this network is treated as an unknown address (a pending site and
        // an invitation), so coordinators cannot learn who has an account elsewhere.
        const role = user ? await roleIn(trial.networkId, user.id, manager) : null;
        if (user && role) {
          growerUserId = user.id;
        } else {
          growerEmail = input.growerEmail;
        }
      }
      const inserted = await manager.getRepository(Site).insert({
        trialId,
        growerUserId,
        growerEmail,
        fieldName: input.fieldName,
        soil: input.soil,
        previousCrop: input.previousCrop,
        fertility: input.fertility,
        notes: input.notes,
      });
      const siteId = String(inserted.identifiers[0]!.id);
      await recordAudit(manager, {
        actorUserId: userId,
        entityType: 'site',
        entityId: siteId,
        siteId,
        action: 'create',
        after: { ...input },
      });
      let invitation: { id: string; email: string } | null = null;
      if (growerEmail) {
        const created = await invitations.invite({
          networkId: trial.networkId,
          email: growerEmail,
          role: 'grower',
          invitedBy: userId,
          inviterRole,
          siteId,
          trialName: trial.name,
          manager,
        });
        invitation = { id: created.id, email: created.email };
      }
      return { siteId, invitation };
    });
  }

  /** Members of the trial's network a coordinator can enrol as growers (growers first). */
  async function people(trialId: string): Promise<NetworkPerson[]> {
    const rows = await dataSource
      .getRepository(Trial)
      .createQueryBuilder('t')
      .innerJoin(Membership, 'm', 'm.network_id = t.network_id')
      .innerJoin(User, 'u', 'u.id = m.user_id')
      .select('u.id', 'id')
      .addSelect('u.name', 'name')
      .addSelect('u.email', 'email')
      .addSelect('m.role', 'role')
      .where('t.id = :trialId', { trialId })
      .orderBy(`(m.role = 'grower')`, 'DESC')
      .addOrderBy('u.name')
      .getRawMany<{ id: string; name: string; email: string; role: Role }>();
    return rows.map((r) => ({ userId: r.id, name: r.name, email: r.email, role: r.role }));
  }

  return { create, get, update, remove, amendments, enrolSite, people };
}

function pick(source: Record<string, unknown>, keys: readonly string[]): Record<string, unknown> {
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
