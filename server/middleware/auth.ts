import type { Express, Request, RequestHandler } from 'express';
import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import pg from 'pg';
import type { AppContext } from '../context';
import type { User } from '../../shared/schemas/user';
import { UserEntity } from '../modules/auth/user.entity';
import { presentUser } from '../modules/auth/presenter';
import { authService } from '../modules/auth/service';

import type { Config } from '../config/env';
import { ROLE_RANK } from '../../shared/constants';

declare module 'express-session' {
  interface SessionData {
    /** When the signed-in account's session began (its absolute lifetime counts from here). */
    signedInAt?: number;
    /** The last request seen on the signed-in session, to the minute (its idle timeout counts from here). */
    lastSeenAt?: number;
  }
}

/**
 * The session cookie's name: `__Host-` where the app is served over HTTPS (production), which the
 * browser accepts only with Secure, Path=/ and no Domain, so no other host or path can plant or shadow it.
 */
export const sessionCookieName = (config: Pick<Config, 'production'>) => (config.production ? '__Host-tw.sid' : 'tw.sid');

// lastSeenAt is written at most this often, so a busy reader does not write their session on every request.
const SEEN_RESOLUTION_MS = 60_000;

/** Sessions in PostgreSQL (connect-pg-simple) and passport-local; returns the pool so the app can close it. */
export function installAuth(app: Express, ctx: AppContext) {
  const pool = new pg.Pool({ connectionString: ctx.config.databaseUrl, max: 5, connectionTimeoutMillis: 3000 });
  pool.on('error', (err) => ctx.logger.warn({ err: err.message }, 'session pool client error'));
  const PgStore = connectPgSimple(session);
  const sessions = session({
    name: sessionCookieName(ctx.config),
    store: new PgStore({
      pool,
      tableName: 'session',
      createTableIfMissing: false,
      pruneSessionInterval: 15 * 60,
      errorLog: (...args: unknown[]) => ctx.logger.warn({ args: String(args[0]) }, 'session store error'),
    }),
    secret: ctx.config.sessionSecret,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: { httpOnly: true, sameSite: 'lax', secure: ctx.config.production, maxAge: ctx.config.sessions.idleMs },
  });
  // express-session saves or touches the session as the response ends and hands a failure (the database
  // just went away) to `next` — after the answer is already out. Passed on, it reaches Express's final
  // handler, which destroys the socket: the client's next request on that kept-alive connection is reset.
  // The answer stands (sign-in and sign-up save the session themselves before answering), so log it and
  // keep the connection.
  app.use((req, res, next) =>
    sessions(req, res, (err?: unknown) => {
      if (err && res.headersSent) {
        ctx.logger.warn({ err: String((err as Error)?.message ?? err), url: req.originalUrl }, 'the session could not be saved after the answer was sent');
        return;
      }
      next(err);
    }),
  );

  const auth = authService(ctx);
  const strategy = new passport.Passport();
  strategy.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      auth.authenticate(email, password).then(
        (u) => done(null, presentUser(u)),
        (err) => done(err),
      );
    }),
  );
  strategy.serializeUser((user, done) => done(null, (user as User).id));
  strategy.deserializeUser((id: string, done) => {
    ctx.dataSource
      .getRepository(UserEntity)
      .findOneBy({ id })
      .then(
        (u) => done(null, u && !u.disabledAt ? presentUser(u) : false),
        (err) => done(err),
      );
  });
  app.use(strategy.initialize());
  app.use(strategy.session());
  app.use(sessionLifetime(ctx.config.sessions));
  return { pool, passport: strategy };
}

/**
 * Ends a signed-in session that has been idle too long (moderators and admins sooner than members) or
 * has outlived its absolute lifetime, however active: the request goes on as a visitor's, on a new id.
 * The cookie's own lifetime follows the idle timeout (rolling), so the browser drops it too.
 */
function sessionLifetime(limits: Config['sessions']): RequestHandler {
  return (req, _res, next) => {
    const user = req.user as User | undefined;
    const s = req.session;
    if (!user || !s) return next();
    const now = Date.now();
    const idleMs = ROLE_RANK[user.role] >= ROLE_RANK.moderator ? limits.privilegedIdleMs : limits.idleMs;
    const signedInAt = s.signedInAt ?? now;
    const lastSeenAt = s.lastSeenAt ?? now;
    if (now - signedInAt > limits.absoluteMs || now - lastSeenAt > idleMs) {
      return req.logout((err) => next(err));
    }
    s.signedInAt = signedInAt;
    if (now - lastSeenAt >= SEEN_RESOLUTION_MS || s.lastSeenAt === undefined) s.lastSeenAt = now;
    s.cookie.maxAge = Math.min(idleMs, limits.absoluteMs - (now - signedInAt));
    next();
  };
}

/** Promise form of passport's req.login (which regenerates the session id). */
export async function logIn(req: Request, user: User) {
  await new Promise<void>((resolve, reject) => req.login(user, (err) => (err ? reject(err) : resolve())));
  // A new session (passport regenerated the id): its lifetime starts now.
  req.session.signedInAt = req.session.lastSeenAt = Date.now();
}

export function logOut(req: Request) {
  return new Promise<void>((resolve, reject) =>
    req.logout((err) => {
      if (err) return reject(err);
      req.session.destroy((e) => (e ? reject(e) : resolve()));
    }),
  );
}
