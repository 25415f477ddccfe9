// Signs a user in on the current session, for sign-in and for accepting an invitation.
import type { Request } from 'express';

/** Logs the user in and rotates the session id, keeping the CSRF token. */
export function logIn(req: Request, user: Express.User): Promise<void> {
  const csrfToken = req.session.csrfToken;
  return new Promise((resolve, reject) => {
    req.session.regenerate((err) => {
      if (err) return reject(err);
      req.session.csrfToken = csrfToken;
      req.login(user, { keepSessionInfo: true } as Parameters<typeof req.login>[1], (loginErr) =>
        loginErr ? reject(loginErr) : resolve(),
      );
    });
  });
}
