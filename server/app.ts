import express, { type Express } from 'express';
import helmet from 'helmet';
import fs from 'node:fs';
import path from 'node:path';
import { LIMITS } from '../shared/constants';
import type { AppContext } from './context';
import { mountRoutes, type RouteDef } from './lib/route';
import { installAuth } from './middleware/auth';
import { csrf } from './middleware/csrf';
import { apiNotFound, buildFileNotFound, errorHandler } from './middleware/error-handler';
import { createLimiters } from './middleware/rate-limit';
import { routeTable } from './routes';
import { buildOpenApi } from './lib/openapi';
import { renderApiDocs } from './lib/api-docs';
import { loadShell } from './lib/html-shell';
import { guidePageHandler, listPageHandlers, parameterPageHandler } from './modules/pages/handler';
import { assertServeable } from './config/env';
import { compressAnswers, staticBuild } from './middleware/compress';
import { requestLog } from './middleware/request-log';
import { oneClickUnsubscribe } from './modules/watches/routes';
import { changesFeed } from './modules/changes/routes';
import { PRIVATE_HEADER } from '../shared/offline';
import { PAGE_PATTERNS } from '../shared/paths';

export type CreatedApp = { app: Express; close: () => Promise<void> };

const defaultDistDir = path.resolve(process.cwd(), 'dist');

/**
 * Browser features the app never uses are switched off for it and anything it might embed, so injected
 * script (or a compromised dependency) cannot ask for a camera, a location or a payment. The only one
 * kept is clipboard writing, for the calculators' "copy result" button, and only for our own origin.
 * Every name is one Chromium knows (an unknown one only earns a console warning); the browser test checks it.
 */
export const PERMISSIONS_POLICY = [
  ...[
    'accelerometer',
    'autoplay',
    'browsing-topics',
    'camera',
    'clipboard-read',
    'display-capture',
    'encrypted-media',
    'fullscreen',
    'geolocation',
    'gyroscope',
    'hid',
    'idle-detection',
    'local-fonts',
    'magnetometer',
    'microphone',
    'midi',
    'payment',
    'picture-in-picture',
    'publickey-credentials-get',
    'screen-wake-lock',
    'serial',
    'usb',
    'xr-spatial-tracking',
  ].map((feature) => `${feature}=()`),
  'clipboard-write=(self)',
].join(', ');

/** Builds the Express app (middleware, module routers, 404, error handler). Does not listen. */
export function createApp(ctx: AppContext, opts: { routes?: RouteDef[]; serveClient?: boolean; clientDir?: string } = {}): CreatedApp {
  assertServeable(ctx.config);
  const routes = opts.routes ?? routeTable;
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', ctx.config.trustProxy ? 1 : false);
  app.set('query parser', 'extended');

  if (ctx.config.env !== 'test') app.use(requestLog(ctx.logger));

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          // The Markdown editor and charts set style attributes; no script may run inline.
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:'],
          fontSrc: ["'self'"],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          // No page of ours sets <base>; an injected one could re-point every relative script and link.
          baseUri: ["'none'"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
          ...(ctx.config.production ? { upgradeInsecureRequests: [] } : {}),
        },
      },
      strictTransportSecurity: ctx.config.production ? { maxAge: 31_536_000, includeSubDomains: true } : false,
      referrerPolicy: { policy: 'strict-origin-when-cross-origin' },
      // Our window and our responses stay ours: no opener handle for other sites, no embedding of our files.
      crossOriginOpenerPolicy: { policy: 'same-origin' },
      crossOriginResourcePolicy: { policy: 'same-origin' },
      crossOriginEmbedderPolicy: false,
    }),
  );
  app.use((_req, res, next) => {
    res.setHeader('Permissions-Policy', PERMISSIONS_POLICY);
    next();
  });

  app.use(compressAnswers());

  // The build's files are served before the session is read: they are the same for everyone, and an
  // answer that went through the session middleware carries a refreshed session cookie. The service
  // worker fetches a whole build's files at once when it installs; one of those answers arriving after
  // a sign-in would put the signed-out session's cookie back (seen as pages drawn signed out under load).
  const distDir = opts.clientDir ?? defaultDistDir;
  const clientBuilt = (opts.serveClient ?? true) && fs.existsSync(path.join(distDir, 'index.html'));
  if (clientBuilt) {
    // The browser checks the service worker and the manifest for a new build; never from a stale copy.
    app.use(['/sw.js', '/manifest.webmanifest'], (_req, res, next) => {
      res.setHeader('Cache-Control', 'no-cache');
      next();
    });
    app.use('/assets', staticBuild(path.join(distDir, 'assets'), { immutable: true, maxAge: '1y', index: false }));
    app.use(staticBuild(distDir, { index: false, maxAge: '1h' }));
  }

  app.use('/api', express.json({ limit: LIMITS.jsonBodyBytes, strict: true }));
  const { pool } = installAuth(app, ctx);
  // Marks every answer given to a session: the service worker stores those apart and drops them at sign-out.
  app.use((req, res, next) => {
    if (req.user) res.setHeader(PRIVATE_HEADER, '1');
    next();
  });
  app.use('/api', csrf.csrfSynchronisedProtection);
  app.use('/api', (_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });

  const api = express.Router();
  mountRoutes(api, routes, ctx, createLimiters(ctx.config));
  const openapi = buildOpenApi(routes, { devTools: ctx.config.devTools });
  api.get('/api/openapi.json', (_req, res) => void res.json(openapi));
  const docsHtml = renderApiDocs(openapi);
  api.get('/api/docs', (_req, res) => void res.type('html').send(docsHtml));
  app.use(api);
  app.use('/api', apiNotFound);
  // Outside /api: mail programs send it without a session or CSRF token (RFC 8058).
  app.post('/unsubscribe/one-click', oneClickUnsubscribe(ctx));
  app.get('/changes.atom', changesFeed(ctx));

  if (opts.serveClient ?? true) {
    if (clientBuilt) {
      const shell = loadShell(distDir);
      app.get([PAGE_PATTERNS.guide, PAGE_PATTERNS.guideVersion], guidePageHandler(ctx, shell));
      app.get(PAGE_PATTERNS.parameter, parameterPageHandler(ctx, shell));
      for (const [route, handler] of Object.entries(listPageHandlers(ctx, shell))) app.get(route, handler);
      // Every route and file is above: what looks like a file here is one this build does not have.
      app.use(buildFileNotFound);
      app.get('/{*splat}', (_req, res) => {
        res.setHeader('Cache-Control', 'no-cache');
        res.type('html').send(shell.plain);
      });
    } else {
      app.get('/{*splat}', (_req, res) => {
        res.status(503).type('text').send('The client is not built yet: run `npm run build` (npm start does this for you).');
      });
    }
  }

  app.use(errorHandler(ctx.logger));
  return { app, close: () => pool.end() };
}
