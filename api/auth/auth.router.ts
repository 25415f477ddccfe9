// Sign-in, sign-out, the current user, CSRF token and password reset.
import { Router, type NextFunction, type Request, type Response } from 'express';
import { rateLimit } from 'express-rate-limit';
import {
  LoginInputSchema,
  PasswordResetCompleteSchema,
  PasswordResetRequestSchema,
} from '../../shared/schemas/auth';
import { AppError, Unauthenticated } from '../errors';
import type { Policies } from '../middleware/access';
import { csrfTokenFor } from '../middleware/csrf';
import { secureRouter, type RouteEntry } from '../lib/route-table';
import { logIn } from '../lib/session-login';
import type { AuthService } from './auth.service';

function tooMany(message: string) {
  return (_req: Request, _res: Response, next: NextFunction) =>
    next(new AppError(429, 'rate_limited', message));
}

export function createAuthRouter(deps: {
  auth: AuthService;
  policies: Policies;
  table: RouteEntry[];
  loginLimit: number;
}) {
  const router = Router();
  const routes = secureRouter(router, deps.table, '/api/auth');
  const { auth, policies } = deps;

  const perIp = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: deps.loginLimit * 5,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: tooMany('Too many sign-in attempts from here; wait a few minutes'),
  });
  const perAccount = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: deps.loginLimit,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) =>
      `account:${String(req.body?.email ?? '')
        .trim()
        .toLowerCase()}`,
    handler: tooMany('Too many sign-in attempts for this account; wait a few minutes'),
  });
  const resetLimit = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: deps.loginLimit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: tooMany('Too many reset requests; wait a few minutes'),
  });

  routes.get('/csrf', policies.public, (req, res) => {
    res.json({ csrfToken: csrfTokenFor(req) });
  });

  routes.post('/login', policies.public, perIp, perAccount, async (req, res) => {
    const input = LoginInputSchema.parse(req.body);
    const user = await auth.verifyPassword(input.email, input.password);
    if (!user) throw new Unauthenticated('The e-mail or password is not right');
    await logIn(req, user);
    res.json(await auth.describeUser(user.id));
  });

  routes.post('/logout', policies.public, async (req, res) => {
    await new Promise<void>((resolve, reject) =>
      req.logout((err) => (err ? reject(err) : resolve())),
    );
    await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
    res.clearCookie('sheaf.sid');
    res.status(204).end();
  });

  routes.get('/me', policies.signedIn, async (req, res) => {
    res.json(await auth.describeUser(req.user!.id));
  });

  routes.post('/password-reset', policies.public, resetLimit, async (req, res) => {
    const input = PasswordResetRequestSchema.parse(req.body);
    await auth.requestPasswordReset(input.email);
    res
      .status(202)
      .json({ message: 'If that address has an account, a reset link is on its way.' });
  });

  routes.post('/password-reset/complete', policies.public, resetLimit, async (req, res) => {
    const input = PasswordResetCompleteSchema.parse(req.body);
    await auth.completePasswordReset(input.token, input.password);
    res.status(204).end();
  });

  return router;
}
