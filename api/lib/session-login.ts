// Signs a user in on the current session, for sign-in and for accepting an invitation.
import type { Request, Response } from 'express';
import { CSRF_HEADER, type Csrf } from '../middleware/csrf';

/**
 * Logs the user in and rotates the session id. The CSRF token is signed with the session id, so
 * it changes here too, and every way of signing in hands out the new one (`X-CSRF-Token`).
 */
export async function logIn(
  req: Request,
  res: Response,
  csrf: Csrf,
  user: Express.User,
): Promise<void> {
  await new Promise<void>((resolve, reject) => {
    req.session.regenerate((err) => {
      if (err) return reject(err);
      req.login(user, { keepSessionInfo: true } as Parameters<typeof req.login>[1], (loginErr) =>
        loginErr ? reject(loginErr) : resolve(),
      );
    });
  });
  res.set(CSRF_HEADER, csrf.tokenFor(req, res));
}
