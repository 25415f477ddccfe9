// Field-packet e-mail: tells each grower their packet (map, seed weights, protocol) is ready.
import type { DataSource } from 'typeorm';
import type { PacketSendResult } from '../../shared/schemas/site';
import { Conflict, NotFound } from '../errors';
import { composeMail, type Mailer } from '../mail/mailer';

interface PacketSite {
  id: string;
  field_name: string;
  trial_name: string;
  season: string | null;
  grower_name: string | null;
  email: string | null;
  pending: boolean;
  randomized: boolean;
}

const SITE_SQL = `SELECT s.id, s.field_name, t.name AS trial_name, t.season, u.name AS grower_name,
       COALESCE(u.email, s.grower_email) AS email, (s.grower_user_id IS NULL) AS pending,
       s.randomized_at IS NOT NULL AS randomized
  FROM sites s JOIN trials t ON t.id = s.trial_id LEFT JOIN users u ON u.id = s.grower_user_id`;

export function createPacketsService(deps: {
  dataSource: DataSource;
  mailer: Mailer;
  publicUrl: string;
}) {
  const { dataSource, mailer, publicUrl } = deps;

  function skipReason(site: PacketSite): string | null {
    if (!site.randomized) return 'Not randomized yet: there is no strip map to send';
    if (!site.email) return 'No grower e-mail on this site';
    return null;
  }

  async function send(site: PacketSite) {
    const url = `${publicUrl.replace(/\/$/, '')}/sites/${site.id}/packet`;
    const greeting = site.grower_name ? `Hello ${site.grower_name},` : 'Hello,';
    await mailer.send(
      composeMail({
        to: site.email!,
        subject: `Your field packet is ready: ${site.field_name} (${site.trial_name})`,
        paragraphs: [
          greeting,
          `Your field packet for ${site.field_name} in the seeding-rate trial "${site.trial_name}"${site.season ? ` (${site.season})` : ''} is ready.`,
          'It holds the strip map, the seed to weigh out for every strip, how to calibrate your seeder, what to count and when, a blank recording sheet and the safety cautions. Print it or save it as a PDF before you go to the field.',
          ...(site.pending
            ? [
                'You will need to accept your invitation to Sheaf first (look for the earlier e-mail) to open the packet.',
              ]
            : []),
        ],
        link: { label: 'Open your field packet', url },
      }),
    );
  }

  async function sendForSite(siteId: string): Promise<PacketSendResult> {
    const [site]: PacketSite[] = await dataSource.query(`${SITE_SQL} WHERE s.id = $1`, [siteId]);
    if (!site) throw new NotFound('Site');
    const reason = skipReason(site);
    if (reason) throw new Conflict(reason);
    await send(site);
    return { sent: [{ siteId: site.id, to: site.email! }], skipped: [] };
  }

  async function sendForTrial(trialId: string, _userId: string): Promise<PacketSendResult> {
    const sites: PacketSite[] = await dataSource.query(
      `${SITE_SQL} WHERE s.trial_id = $1 ORDER BY s.created_at`,
      [trialId],
    );
    const result: PacketSendResult = { sent: [], skipped: [] };
    for (const site of sites) {
      const reason = skipReason(site);
      if (reason) {
        result.skipped.push({ siteId: site.id, reason });
        continue;
      }
      await send(site);
      result.sent.push({ siteId: site.id, to: site.email! });
    }
    return result;
  }

  return { sendForSite, sendForTrial };
}
