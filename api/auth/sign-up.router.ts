// Sign-up routes under /api/auth: whether sign-up is open, sign up, confirm the e-mail link.
import { Router } from 'express';
import { SignUpConfirmSchema, SignUpInputSchema } from '../../shared/schemas/network';
import { secureRouter } from '../lib/route-table';
import type { RouterContext } from '../lib/router-context';
import { logIn } from '../lib/session-login';
import { createSignUpService } from './sign-up.service';

export function createSignUpRouter(ctx: RouterContext) {
  const router = Router();
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

  routes.post('/sign-up', ctx.policies.public, async (req, res) => {
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
