import type { Express, Request } from 'express';
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

export const SESSION_COOKIE = 'tw.sid';

/** Sessions in PostgreSQL (connect-pg-simple) and passport-local; returns the pool so the app can close it. */
export function installAuth(app: Express, ctx: AppContext) {
  const pool = new pg.Pool({ connectionString: ctx.config.databaseUrl, max: 5, connectionTimeoutMillis: 3000 });
  pool.on('error', (err) => ctx.logger.warn({ err: err.message }, 'session pool client error'));
  const PgStore = connectPgSimple(session);
  const sessions = session({
    name: SESSION_COOKIE,
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
    cookie: { httpOnly: true, sameSite: 'lax', secure: ctx.config.production, maxAge: 14 * 24 * 3600_000 },
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
  return { pool, passport: strategy };
}

/** Promise form of passport's req.login (which regenerates the session id). */
export function logIn(req: Request, user: User) {
  return new Promise<void>((resolve, reject) => req.login(user, (err) => (err ? reject(err) : resolve())));
}

export function logOut(req: Request) {
  return new Promise<void>((resolve, reject) =>
    req.logout((err) => {
      if (err) return reject(err);
      req.session.destroy((e) => (e ? reject(e) : resolve()));
    }),
  );
}
