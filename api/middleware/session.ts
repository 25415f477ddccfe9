// Sessions in PostgreSQL (connect-pg-simple) and passport-local sign-in.
import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type pg from 'pg';
import type { AppConfig } from '../config/env';
import type { Request } from 'express';
import type { DataSource } from 'typeorm';
import { Membership } from '../../db/entities/membership.entity';
import { User } from '../../db/entities/user.entity';
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

/**
 * The signed-in user and their role in each network, read in one query on every request (so a
 * removed account, a sign-out elsewhere or a role change applies at once on every process). The
 * roles are kept on the request for the access policies.
 */
async function loadSessionUser(dataSource: DataSource, req: Request, userId: string) {
  const user = await dataSource
    .getRepository(User)
    .createQueryBuilder('user')
    .leftJoinAndMapMany('user.memberships', Membership, 'membership', 'membership.userId = user.id')
    .select(['user.id', 'user.email', 'user.name', 'membership.networkId', 'membership.role'])
    .where('user.id = :userId', { userId })
    .getOne();
  if (!user) return null;
  const memberships = (user as User & { memberships: Membership[] }).memberships;
  req.access = { userId: user.id, roles: new Map(memberships.map((m) => [m.networkId, m.role])) };
  return { id: user.id, email: user.email, name: user.name };
}

/** A passport instance of our own, so several apps (tests) can live in one process. */
export function createPassport(auth: AuthService, dataSource: DataSource) {
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
  // passport hands the request to a three-argument deserializer.
  instance.deserializeUser(
    (req: Request, id: string, done: (err: unknown, user?: Express.User | false) => void) => {
      loadSessionUser(dataSource, req, id).then((user) => done(null, user ?? false), done);
    },
  );
  return instance;
}
