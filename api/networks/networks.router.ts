// Network routes: the caller's networks, start another one, delete one after typing its name.
import { Router } from 'express';
import { CreateNetworkInputSchema, DeleteNetworkInputSchema } from '../../shared/schemas/network';
import { Forbidden } from '../errors';
import { secureRouter } from '../lib/route-table';
import type { RouterContext } from '../lib/router-context';
import { createNetworksService } from './networks.service';

export function createNetworksRouter(ctx: RouterContext) {
  const router = Router();
  const routes = secureRouter(router, ctx.table, '/api');
  const networks = createNetworksService({
    dataSource: ctx.dataSource,
    uploadDir: ctx.config.UPLOAD_DIR,
  });

  routes.get('/networks', ctx.policies.signedIn, async (req, res) => {
    res.json(await networks.mine(req.user!.id));
  });

  routes.post('/networks', ctx.policies.signedIn, async (req, res) => {
    const { name } = CreateNetworkInputSchema.parse(req.body);
    // Invite-only instances let only existing admins start networks.
    if (ctx.config.SIGNUP !== 'open' && ![...req.access!.roles.values()].includes('admin'))
      throw new Forbidden('This Sheaf is invite-only: only an admin can start a network');
    res.status(201).json(await networks.create(req.user!.id, name));
  });

  routes.delete('/networks/:networkId', ctx.policies.networkCoordinator(), async (req, res) => {
    const { confirmName } = DeleteNetworkInputSchema.parse(req.body ?? {});
    res.json(
      await networks.remove({
        networkId: String(req.params.networkId),
        actorUserId: req.user!.id,
        confirmName,
      }),
    );
  });

  return router;
}
