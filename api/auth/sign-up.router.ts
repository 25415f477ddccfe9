// Sign-up routes under /api/auth: whether sign-up is open, sign up, confirm the e-mail link.
import { Router, type Request } from 'express';
import rateLimit from 'express-rate-limit';
import { AppError } from '../errors';
import { PostgresRateLimitStore } from '../middleware/rate-limit-store';
import { SignUpConfirmSchema, SignUpInputSchema } from '../../shared/schemas/network';
import { secureRouter } from '../lib/route-table';
import type { RouterContext } from '../lib/router-context';
import { logIn } from '../lib/session-login';
import { createSignUpService } from './sign-up.service';

/**
 * Each sign-up sends an e-mail, so they are limited per hour in PostgreSQL: per client address,
 * and per address written in the form (so many clients cannot flood one inbox).
 */
function signUpLimit(ctx: RouterContext, name: string, key?: (req: Request) => string) {
  return rateLimit({
    store: new PostgresRateLimitStore(ctx.dataSource, `${name}:`),
    windowMs: 60 * 60 * 1000,
    limit: ctx.config.RATE_LIMIT_LOGIN,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    ...(key ? { keyGenerator: key } : {}),
    handler: (_req, _res, next) =>
      next(
        new AppError(429, 'rate_limited', 'Too many sign-ups in the last hour; try again later'),
      ),
  });
}

export function createSignUpRouter(ctx: RouterContext) {
  const router = Router();
  const perClient = signUpLimit(ctx, 'sign-up');
  const perInbox = signUpLimit(ctx, 'sign-up-mail', (req) =>
    String(req.body?.email ?? '')
      .trim()
      .toLowerCase(),
  );
  const routes = secureRouter(router, ctx.table, '/api/auth');
  const signUps = createSignUpService({
    dataSource: ctx.dataSource,
    mailer: ctx.mailer,
    publicUrl: ctx.config.PUBLIC_URL,
    passwordCost: ctx.config.BCRYPT_COST,
    open: ctx.config.SIGNUP === 'open',
  });

  routes.get('/sign-up', ctx.policies.public, (_req, res) => {
    res.json({ open: signUps.open });
  });

  routes.post('/sign-up', ctx.policies.public, perClient, perInbox, async (req, res) => {
    const input = SignUpInputSchema.parse(req.body);
    await signUps.signUp(input);
    res.status(202).json({
      message: `We sent a confirmation link to ${input.email}. Open it to finish starting your network.`,
    });
  });

  routes.post('/sign-up/confirm', ctx.policies.public, async (req, res) => {
    const { token } = SignUpConfirmSchema.parse(req.body);
    const userId = await signUps.confirm(token);
    const user = await ctx.auth.findSessionUser(userId);
    await logIn(req, res, ctx.csrf, user!);
    res.status(201).json(await ctx.auth.describeUser(userId));
  });

  return router;
}
