// Sessions in PostgreSQL (connect-pg-simple) and passport-local sign-in.
import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type pg from 'pg';
import type { AppConfig } from '../config/env';
import type { AuthService } from '../auth/auth.service';

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

export function createSessionMiddleware(config: AppConfig, pool: pg.Pool) {
  const PgStore = connectPgSimple(session);
  return session({
    // No touch on every request: a read-only request then costs at most one session SELECT.
    store: new PgStore({
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
  // Read on every request, so a removed or renamed account applies on every server process at once.
  instance.deserializeUser((id: string, done) => {
    auth.findSessionUser(id).then((user) => done(null, user ?? false), done);
  });
  return instance;
}
