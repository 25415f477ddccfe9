// People routes: a coordinator's view of the network's members and open invitations; change a
// role, remove a person, revoke an invitation.
import { Router } from 'express';
import { IdSchema } from '../../shared/schemas/common';
import { MemberRoleUpdateSchema } from '../../shared/schemas/people';
import { NotFound } from '../errors';
import type { RouterContext } from '../lib/router-context';
import { secureRouter } from '../lib/route-table';
import { createPeopleService } from './people.service';

export function createPeopleRouter(ctx: RouterContext) {
  const router = Router();
  const routes = secureRouter(router, ctx.table, '/api');
  const people = createPeopleService(ctx.dataSource);

  /** A malformed id is a resource that does not exist (and never reaches a uuid column). */
  function idParam(value: unknown, what: string): string {
    const parsed = IdSchema.safeParse(value);
    if (!parsed.success) throw new NotFound(what);
    return parsed.data;
  }

  routes.get('/networks/:networkId/people', ctx.policies.networkCoordinator(), async (req, res) => {
    res.json(await people.list(String(req.params.networkId)));
  });

  routes.patch(
    '/networks/:networkId/members/:userId',
    ctx.policies.networkCoordinator(),
    async (req, res) => {
      const networkId = String(req.params.networkId);
      const userId = idParam(req.params.userId, 'Person');
      const { role } = MemberRoleUpdateSchema.parse(req.body);
      const actorRole = req.access!.roles.get(networkId)!;
      res.json(
        await people.changeRole({ networkId, userId, role, actorUserId: req.user!.id, actorRole }),
      );
    },
  );

  routes.delete(
    '/networks/:networkId/members/:userId',
    ctx.policies.networkCoordinator(),
    async (req, res) => {
      const networkId = String(req.params.networkId);
      const userId = idParam(req.params.userId, 'Person');
      const actorRole = req.access!.roles.get(networkId)!;
      res.json(await people.remove({ networkId, userId, actorUserId: req.user!.id, actorRole }));
    },
  );

  routes.delete(
    '/networks/:networkId/invitations/:invitationId',
    ctx.policies.networkCoordinator(),
    async (req, res) => {
      const networkId = String(req.params.networkId);
      const invitationId = idParam(req.params.invitationId, 'Invitation');
      await people.revokeInvitation({ networkId, invitationId, actorUserId: req.user!.id });
      res.status(204).end();
    },
  );

  return router;
}
