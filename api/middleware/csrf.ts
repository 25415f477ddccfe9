// CSRF protection by a signed double-submit cookie: the token lives in a cookie (no session row
// for anonymous visitors) and must come back in the X-CSRF-Token header on every state-changing
// request. It is signed with the session id once someone signs in, so it changes at sign-in and
// a token from before sign-in (or from another session) is refused. Written here (about 60
// lines) because the well-known package (csurf) is deprecated and the pattern needs only crypto.
import crypto from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import { AppError } from '../errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
export const CSRF_COOKIE = 'sheaf.csrf';
export const CSRF_HEADER = 'X-CSRF-Token';

export interface Csrf {
  /** The request's valid token, minting (and setting the cookie for) a new one when needed. */
  tokenFor(req: Request, res: Response): string;
  /** Forgets the cookie's token (sign-out). */
  clear(res: Response): void;
  require: RequestHandler;
}

function readCookie(req: Request, name: string): string | null {
  for (const part of (req.headers.cookie ?? '').split(';')) {
    const at = part.indexOf('=');
    if (at > 0 && part.slice(0, at).trim() === name) {
      try {
        return decodeURIComponent(part.slice(at + 1).trim());
      } catch {
        return null;
      }
    }
  }
  return null;
}

function sameText(a: string, b: string): boolean {
  const left = Buffer.from(a);
  const right = Buffer.from(b);
  return left.length === right.length && crypto.timingSafeEqual(left, right);
}

export function createCsrf(options: { secret: string; secure: boolean }): Csrf {
  /** Signed-in requests bind the token to their session; anonymous ones share one binding. */
  const binding = (req: Request) => (req.user ? `session:${req.sessionID}` : 'anonymous');
  const sign = (req: Request, nonce: string) =>
    crypto
      .createHmac('sha256', options.secret)
      .update(`${binding(req)}|${nonce}`)
      .digest('base64url');
  const isValid = (req: Request, token: string | null): token is string => {
    if (!token) return false;
    const [nonce, signature, extra] = token.split('.');
    return !!nonce && !!signature && extra === undefined && sameText(signature, sign(req, nonce));
  };
  const cookieOptions = {
    httpOnly: true,
    sameSite: 'lax' as const,
    secure: options.secure,
    path: '/',
  };

  return {
    tokenFor(req, res) {
      const current = readCookie(req, CSRF_COOKIE);
      if (isValid(req, current)) return current;
      const nonce = crypto.randomBytes(18).toString('base64url');
      const token = `${nonce}.${sign(req, nonce)}`;
      res.cookie(CSRF_COOKIE, token, cookieOptions);
      return token;
    },
    clear(res) {
      res.clearCookie(CSRF_COOKIE, cookieOptions);
    },
    require(req, _res, next) {
      if (SAFE_METHODS.has(req.method)) return next();
      const sent = req.get(CSRF_HEADER);
      const cookie = readCookie(req, CSRF_COOKIE);
      if (!sent || !cookie || !sameText(sent, cookie) || !isValid(req, cookie)) {
        return next(
          new AppError(403, 'csrf_invalid', 'The form expired; reload the page and try again'),
        );
      }
      next();
    },
  };
}
