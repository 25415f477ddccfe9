// Sessions in PostgreSQL (connect-pg-simple) and passport-local sign-in.
import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type pg from 'pg';
import type { AppConfig } from '../config/env';
import type { AuthService } from '../auth/auth.service';
import { createFreshCache, SHORT_LIVED } from '../lib/fresh-cache';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface User {
      id: string;
      email: string;
      name: string;
    }
  }
}

type SessionCallback = (err: unknown, session?: session.SessionData | null) => void;

export function createSessionMiddleware(config: AppConfig, pool: pg.Pool) {
  const PgStore = connectPgSimple(session);
  const recent = createFreshCache<string | null>(SHORT_LIVED);
  /** PostgreSQL session store that answers repeated reads of one session from memory for 2 s. */
  class CachedPgStore extends PgStore {
    override get(sid: string, callback: SessionCallback) {
      const stored = recent.get(
        sid,
        () =>
          new Promise<string | null>((resolve, reject) => {
            super.get(sid, (err: unknown, data?: session.SessionData | null) =>
              err ? reject(err) : resolve(data ? JSON.stringify(data) : null),
            );
          }),
      );
      // Each request gets its own copy: express-session changes the object it is given.
      stored.then(
        (text) => callback(null, text === null ? null : JSON.parse(text)),
        (err: unknown) => callback(err),
      );
    }
    // Forget the session before and after the write: a read in between would cache the old row.
    override set(sid: string, data: session.SessionData, callback?: (err?: unknown) => void) {
      recent.delete(sid);
      super.set(sid, data, (err?: unknown) => {
        recent.delete(sid);
        callback?.(err);
      });
    }
    override destroy(sid: string, callback?: (err?: unknown) => void) {
      recent.delete(sid);
      super.destroy(sid, (err?: unknown) => {
        recent.delete(sid);
        callback?.(err);
      });
    }
  }
  return session({
    // No touch on every request: a read-only request then costs at most one session SELECT.
    store: new CachedPgStore({
      pool,
      tableName: 'user_sessions',
      createTableIfMissing: false,
      pruneSessionInterval: 60 * 15,
      disableTouch: true,
    }),
    name: 'sheaf.sid',
    secret: config.SESSION_SECRET,
    resave: false,
    saveUninitialized: false,
    rolling: false,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: config.NODE_ENV === 'production',
      maxAge: 1000 * 60 * 60 * 24 * 14,
    },
  });
}

/** A passport instance of our own, so several apps (tests) can live in one process. */
export function createPassport(auth: AuthService) {
  const instance = new passport.Passport();
  instance.use(
    new LocalStrategy(
      { usernameField: 'email', passwordField: 'password' },
      (email, password, done) => {
        auth.verifyPassword(email, password).then((user) => done(null, user ?? false), done);
      },
    ),
  );
  instance.serializeUser((user, done) => done(null, user.id));
  const users = createFreshCache<Express.User | null>(SHORT_LIVED);
  instance.deserializeUser((id: string, done) => {
    users
      .get(id, async () => (await auth.findSessionUser(id)) ?? null)
      .then((user) => done(null, user ?? false), done);
  });
  return instance;
}
