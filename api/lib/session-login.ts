// Signs a user in on the current session, for sign-in and for accepting an invitation.
import type { Request } from 'express';

/**
 * Logs the user in and rotates the session id. The CSRF token is signed with the session id, so
 * it changes here too: the caller hands out the new one (`X-CSRF-Token`), or the web client
 * fetches it after its next write is refused.
 */
export function logIn(req: Request, user: Express.User): Promise<void> {
  return new Promise((resolve, reject) => {
    req.session.regenerate((err) => {
      if (err) return reject(err);
      req.login(user, { keepSessionInfo: true } as Parameters<typeof req.login>[1], (loginErr) =>
        loginErr ? reject(loginErr) : resolve(),
      );
    });
  });
}
