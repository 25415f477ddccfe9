// Admin-only tools. Caught mail is a development aid: the route exists only outside production,
// when a mail catcher is configured and the server listens on loopback, and each admin sees only
// mail addressed to people of the networks they administer.
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import { Invitation } from '../../db/entities/invitation.entity';
import { Membership } from '../../db/entities/membership.entity';
import { Site } from '../../db/entities/site.entity';
import { fetchCaughtMail } from '../mail/mail-catcher';
import type { Policies } from '../middleware/access';
import { secureRouter, type RouteEntry } from '../lib/route-table';

const LOOPBACK = new Set(['127.0.0.1', '::1', 'localhost']);

/** Whether this server may serve caught mail at all (development, loopback, catcher on). */
export function servesCaughtMail(config: {
  NODE_ENV: string;
  HOST: string;
  MAIL_CATCHER_URL?: string;
}): boolean {
  return config.NODE_ENV !== 'production' && !!config.MAIL_CATCHER_URL && LOOPBACK.has(config.HOST);
}

/** Every address that belongs to the given networks: members, pending invitations and growers. */
async function networkAddresses(
  dataSource: DataSource,
  networkIds: string[],
): Promise<Set<string>> {
  const [members, invitations, sites] = await Promise.all([
    dataSource.getRepository(Membership).find({
      select: { id: true, user: { id: true, email: true } },
      relations: { user: true },
      where: { networkId: In(networkIds) },
    }),
    dataSource.getRepository(Invitation).find({
      select: { id: true, email: true },
      where: { networkId: In(networkIds) },
    }),
    dataSource
      .getRepository(Site)
      .createQueryBuilder('site')
      .innerJoin('site.trial', 'trial')
      .select(['site.id', 'site.growerEmail'])
      .where('trial.networkId IN (:...networkIds)', { networkIds })
      .andWhere('site.growerEmail IS NOT NULL')
      .getMany(),
  ]);
  return new Set(
    [
      ...members.map((m) => m.user?.email),
      ...invitations.map((i) => i.email),
      ...sites.map((s) => s.growerEmail),
    ]
      .filter((email): email is string => !!email)
      .map((email) => email.toLowerCase()),
  );
}

export function createAdminRouter(deps: {
  catcherUrl: string | null;
  dataSource: DataSource;
  policies: Policies;
  table: RouteEntry[];
}) {
  const router = Router();
  const routes = secureRouter(router, deps.table, '/api/admin');
  const catcherUrl = deps.catcherUrl;
  if (catcherUrl) {
    routes.get('/mail', deps.policies.admin, async (req, res) => {
      const adminOf = [...req.access!.roles].filter(([, role]) => role === 'admin');
      const addresses = await networkAddresses(
        deps.dataSource,
        adminOf.map(([networkId]) => networkId),
      );
      const messages = await fetchCaughtMail(catcherUrl);
      res.json(
        messages
          .filter((mail) => mail.to.some((to) => addresses.has(to.toLowerCase())))
          .slice(0, 200),
      );
    });
  }
  return router;
}
