// Sign-in, sign-out, the current user, CSRF token and password reset.
import { Router, type NextFunction, type Request, type Response } from 'express';
import { rateLimit } from 'express-rate-limit';
import type { DataSource } from 'typeorm';
import {
  LoginInputSchema,
  PasswordResetCompleteSchema,
  PasswordResetRequestSchema,
} from '../../shared/schemas/auth';
import { AppError, Unauthenticated } from '../errors';
import type { Policies } from '../middleware/access';
import type { Csrf } from '../middleware/csrf';
import { PostgresRateLimitStore } from '../middleware/rate-limit-store';
import { secureRouter, type RouteEntry } from '../lib/route-table';
import { logIn } from '../lib/session-login';
import type { AuthService } from './auth.service';
import { createSignInLimiter } from './sign-in-limiter';

function tooMany(message: string) {
  return (_req: Request, _res: Response, next: NextFunction) =>
    next(new AppError(429, 'rate_limited', message));
}

export function createAuthRouter(deps: {
  auth: AuthService;
  policies: Policies;
  table: RouteEntry[];
  loginLimit: number;
  dataSource: DataSource;
  csrf: Csrf;
}) {
  const router = Router();
  const routes = secureRouter(router, deps.table, '/api/auth');
  const { auth, policies, csrf } = deps;
  const limiter = createSignInLimiter(deps.dataSource, deps.loginLimit);

  const resetLimit = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: deps.loginLimit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new PostgresRateLimitStore(deps.dataSource, 'password-reset:'),
    handler: tooMany('Too many reset requests; wait a few minutes'),
  });

  routes.get('/csrf', policies.public, (req, res) => {
    res.set('Cache-Control', 'no-store');
    res.json({ csrfToken: csrf.tokenFor(req, res) });
  });

  routes.post('/login', policies.public, async (req, res) => {
    const input = LoginInputSchema.parse(req.body);
    const address = req.ip ?? 'unknown';
    if (await limiter.isBlocked(input.email, address)) {
      throw new AppError(
        429,
        'rate_limited',
        'Too many wrong passwords for this account from here; wait 15 minutes or reset the password',
      );
    }
    const user = await auth.verifyPassword(input.email, input.password);
    if (!user) {
      await limiter.recordFailure(input.email, address);
      throw new Unauthenticated('The e-mail or password is not right');
    }
    await limiter.recordSuccess(input.email, address);
    await logIn(req, res, csrf, user);
    res.json(await auth.describeUser(user.id));
  });

  routes.post('/logout', policies.public, async (req, res) => {
    await new Promise<void>((resolve, reject) =>
      req.logout((err) => (err ? reject(err) : resolve())),
    );
    await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
    res.clearCookie('sheaf.sid');
    csrf.clear(res);
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
