// Trial progress for the coordinator (which measurements are in, per site) and reminder e-mails
// to growers with counts still missing.
import type { DataSource } from 'typeorm';
import { AuditEvent } from '../../db/entities/audit-event.entity';
import { Site } from '../../db/entities/site.entity';
import { Trial } from '../../db/entities/trial.entity';
import {
  MEASUREMENT_GROUPS,
  MEASUREMENT_GROUP_NAMES,
  type MeasurementGroup,
  type RemindersResult,
  type SendRemindersInput,
  type TrialProgress,
} from '../../shared/schemas/strip';
import { recordedGroups } from '../../shared/units/strip-derived';
import { NotFound } from '../errors';
import { loadSite, loadSiteStrips } from '../lib/strip-data';
import { composeMail, type Mailer } from '../mail/mailer';

export function createProgressService(deps: {
  dataSource: DataSource;
  mailer: Mailer;
  publicUrl: string;
}) {
  const { dataSource } = deps;

  /** When each site's data last changed (its newest audit event). */
  async function lastChanges(siteIds: string[]): Promise<Map<string, Date>> {
    if (siteIds.length === 0) return new Map();
    const rows: { siteId: string; lastChange: Date }[] = await dataSource
      .getRepository(AuditEvent)
      .createQueryBuilder('event')
      .select('event.siteId', 'siteId')
      .addSelect('MAX(event.createdAt)', 'lastChange')
      .where('event.siteId IN (:...siteIds)', { siteIds })
      .groupBy('event.siteId')
      .getRawMany();
    return new Map(rows.map((r) => [r.siteId, r.lastChange]));
  }

  async function progress(trialId: string): Promise<TrialProgress> {
    const trial = await dataSource
      .getRepository(Trial)
      .findOne({ select: { id: true, name: true }, where: { id: trialId } });
    if (!trial) throw new NotFound('Trial');
    const siteRows = await dataSource.getRepository(Site).find({
      select: { id: true },
      where: { trialId },
      order: { fieldName: 'ASC', id: 'ASC' },
    });
    const changedAt = await lastChanges(siteRows.map((s) => s.id));
    const sites = [];
    for (const row of siteRows) {
      const site = await loadSite(dataSource.manager, row.id);
      const strips = await loadSiteStrips(dataSource.manager, row.id);
      const recorded = { stand: 0, tillers: 0, heads: 0, yield: 0 };
      for (const strip of strips) {
        const groups = recordedGroups(strip.values);
        for (const group of MEASUREMENT_GROUPS) if (groups[group]) recorded[group] += 1;
      }
      sites.push({
        siteId: site.siteId,
        fieldName: site.fieldName,
        growerName: site.growerName,
        growerEmail: site.growerEmail,
        stripCount: strips.length,
        recorded,
        dates: {
          sowingDate: site.sowingDate,
          emergenceDate: site.emergenceDate,
          headingDate: site.headingDate,
          harvestDate: site.harvestDate,
        },
        publishedAt: site.publishedAt,
        lastChangeAt: changedAt.get(row.id)?.toISOString() ?? null,
      });
    }
    return { trialId: trial.id, trialName: trial.name, sites };
  }

  return {
    progress,

    async sendReminders(trialId: string, input: SendRemindersInput): Promise<RemindersResult> {
      const current = await progress(trialId);
      const groups: readonly MeasurementGroup[] = input.groups ?? MEASUREMENT_GROUPS;
      const result: RemindersResult = { sent: [], skipped: [] };
      for (const site of current.sites) {
        if (input.siteIds && !input.siteIds.includes(site.siteId)) continue;
        if (site.stripCount === 0) {
          result.skipped.push({ siteId: site.siteId, reason: 'The site has no strips yet' });
          continue;
        }
        const missing = groups
          .map((group) => ({ group, count: site.stripCount - site.recorded[group] }))
          .filter((m) => m.count > 0);
        if (missing.length === 0) {
          result.skipped.push({ siteId: site.siteId, reason: 'Nothing is missing' });
          continue;
        }
        if (site.publishedAt) {
          result.skipped.push({ siteId: site.siteId, reason: 'The site report is published' });
          continue;
        }
        if (!site.growerEmail) {
          result.skipped.push({ siteId: site.siteId, reason: 'The site has no grower e-mail' });
          continue;
        }
        const lines = missing.map(
          (m) =>
            `${MEASUREMENT_GROUP_NAMES[m.group]}: ${m.count} of ${site.stripCount} strips still to enter.`,
        );
        const mail = composeMail({
          to: site.growerEmail,
          subject: `Sheaf: numbers still missing for ${site.fieldName}`,
          paragraphs: [
            `Hello${site.growerName ? ` ${site.growerName}` : ''},`,
            `${current.trialName} is waiting for some numbers from ${site.fieldName}:`,
            ...lines,
            ...(input.message ? [input.message] : []),
            'You can type them on your phone strip by strip, or upload the CSV template from the site page.',
          ],
          link: { label: 'Open your site', url: `${deps.publicUrl}/sites/${site.siteId}` },
        });
        await deps.mailer.send(mail);
        result.sent.push({ siteId: site.siteId, to: site.growerEmail });
      }
      return result;
    },
  };
}
