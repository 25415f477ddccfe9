// Field-packet e-mail: tells each grower their packet (map, seed weights, protocol) is ready.
import type { DataSource, FindOptionsWhere } from 'typeorm';
import { Site } from '../../db/entities/site.entity';
import type { PacketSendResult } from '../../shared/schemas/site';
import { Conflict, NotFound } from '../errors';
import { composeMail, type Mailer } from '../mail/mailer';

interface PacketSite {
  id: string;
  fieldName: string;
  trialName: string;
  season: string | null;
  growerName: string | null;
  email: string | null;
  /** The grower has not accepted their invitation yet. */
  pending: boolean;
  randomized: boolean;
}

function toPacketSite(site: Site): PacketSite {
  return {
    id: site.id,
    fieldName: site.fieldName,
    trialName: site.trial!.name,
    season: site.trial!.season,
    growerName: site.grower?.name ?? null,
    email: site.grower?.email ?? site.growerEmail,
    pending: site.growerUserId === null,
    randomized: site.randomizedAt !== null,
  };
}

export function createPacketsService(deps: {
  dataSource: DataSource;
  mailer: Mailer;
  publicUrl: string;
}) {
  const { dataSource, mailer, publicUrl } = deps;

  /** Sites with what the packet e-mail names: trial, season and grower. */
  async function findPacketSites(where: FindOptionsWhere<Site>): Promise<PacketSite[]> {
    const sites = await dataSource.getRepository(Site).find({
      select: {
        id: true,
        fieldName: true,
        growerUserId: true,
        growerEmail: true,
        randomizedAt: true,
        trial: { id: true, name: true, season: true },
        grower: { id: true, name: true, email: true },
      },
      relations: { trial: true, grower: true },
      where,
      order: { createdAt: 'ASC' },
    });
    return sites.map(toPacketSite);
  }

  function skipReason(site: PacketSite): string | null {
    if (!site.randomized) return 'Not randomized yet: there is no strip map to send';
    if (!site.email) return 'No grower e-mail on this site';
    return null;
  }

  async function send(site: PacketSite) {
    const url = `${publicUrl.replace(/\/$/, '')}/sites/${site.id}/packet`;
    const greeting = site.growerName ? `Hello ${site.growerName},` : 'Hello,';
    await mailer.send(
      composeMail({
        to: site.email!,
        subject: `Your field packet is ready: ${site.fieldName} (${site.trialName})`,
        paragraphs: [
          greeting,
          `Your field packet for ${site.fieldName} in the seeding-rate trial "${site.trialName}"${site.season ? ` (${site.season})` : ''} is ready.`,
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
    const [site] = await findPacketSites({ id: siteId });
    if (!site) throw new NotFound('Site');
    const reason = skipReason(site);
    if (reason) throw new Conflict(reason);
    await send(site);
    return { sent: [{ siteId: site.id, to: site.email! }], skipped: [] };
  }

  async function sendForTrial(trialId: string, _userId: string): Promise<PacketSendResult> {
    const sites = await findPacketSites({ trialId });
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
