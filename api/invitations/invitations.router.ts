// Invitation routes: create (coordinators), preview and accept (the invited person).
import { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import { AppError, NotFound } from '../errors';
import { z } from 'zod';
import { InvitationAcceptSchema, InvitationCreateSchema } from '../../shared/schemas/auth';
import type { AuthService } from '../auth/auth.service';
import { logIn } from '../lib/session-login';
import type { Policies } from '../middleware/access';
import { secureRouter, type RouteEntry } from '../lib/route-table';
import { PostgresRateLimitStore } from '../middleware/rate-limit-store';
import type { Csrf } from '../middleware/csrf';
import type { DataSource } from 'typeorm';
import type { InvitationsService } from './invitations.service';

export function createInvitationsRouter(deps: {
  invitations: InvitationsService;
  auth: AuthService;
  policies: Policies;
  table: RouteEntry[];
  inviteLimit: number;
  dataSource: DataSource;
  csrf: Csrf;
}) {
  const router = Router();
  const routes = secureRouter(router, deps.table, '/api');
  const { invitations, auth, policies } = deps;
  const limit = (
    name: string,
    max: number,
    message: string,
    key?: (req: import('express').Request) => string,
  ) =>
    rateLimit({
      store: new PostgresRateLimitStore(deps.dataSource, `${name}:`),
      windowMs: 60 * 60 * 1000,
      limit: max,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      ...(key ? { keyGenerator: key } : {}),
      handler: (_req, _res, next) => next(new AppError(429, 'rate_limited', message)),
    });
  const invitePerUser = limit(
    'invite',
    deps.inviteLimit,
    'Too many invitations sent in the last hour; try again later',
    (req) => `user:${req.user?.id ?? 'anonymous'}`,
  );
  const acceptPerIp = limit(
    'invite-accept',
    deps.inviteLimit,
    'Too many attempts; wait a while and try again',
  );

  routes.post(
    '/networks/:networkId/invitations',
    policies.networkCoordinator(),
    invitePerUser,
    async (req, res) => {
      const input = InvitationCreateSchema.parse(req.body);
      const networkId = String(req.params.networkId);
      const inviterRole = req.access!.roles.get(networkId)!;
      const created = await invitations.invite({
        ...input,
        networkId,
        invitedBy: req.user!.id,
        inviterRole,
      });
      res.status(201).json({
        id: created.id,
        email: created.email,
        role: created.role,
        expiresAt: created.expiresAt,
      });
    },
  );

  routes.get('/invitations/:token', policies.public, async (req, res) => {
    // A malformed token is just an invitation that does not exist.
    const parsed = z.string().min(10).max(200).safeParse(req.params.token);
    if (!parsed.success) throw new NotFound('Invitation');
    const token = parsed.data;
    res.json(await invitations.preview(token));
  });

  routes.post('/invitations/accept', policies.public, acceptPerIp, async (req, res) => {
    const input = InvitationAcceptSchema.parse(req.body);
    const userId = await invitations.accept(input);
    const user = await auth.findSessionUser(userId);
    await logIn(req, res, deps.csrf, user!);
    res.json(await auth.describeUser(userId));
  });

  return router;
}
