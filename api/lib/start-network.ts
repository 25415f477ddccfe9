// Starting a network: a fresh network with its first person as admin (sign-up and "start
// another network" both use it).
import crypto from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { Membership } from '../../db/entities/membership.entity';
import { Network } from '../../db/entities/network.entity';
import { recordAudit } from '../audit/audit.service';

function slugFor(name: string): string {
  const base = name
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '')
    .slice(0, 40);
  return `${base || 'network'}-${crypto.randomBytes(3).toString('hex')}`;
}

/** Creates a network with `userId` as its admin, inside the caller's transaction. */
export async function startNetwork(
  manager: EntityManager,
  name: string,
  userId: string,
): Promise<string> {
  const network = await manager
    .getRepository(Network)
    .save(manager.getRepository(Network).create({ name, slug: slugFor(name), isDemo: false }));
  await manager.getRepository(Membership).insert({ userId, networkId: network.id, role: 'admin' });
  await recordAudit(manager, {
    actorUserId: userId,
    entityType: 'network',
    entityId: network.id,
    action: 'create',
    after: { name },
  });
  return network.id;
}
