import type { Request, RequestHandler, Response } from 'express';
import { slugSchema } from '../../../shared/schemas/common';
import type { User } from '../../../shared/schemas/user';
import type { AppContext } from '../../context';
import type { Shell } from '../../lib/html-shell';
import type { DrawnPage } from './anonymous-pages';
import { guidePageHtml } from './guide-page';
import { guidesPageHtml, homePageHtml, parametersPageHtml, searchPageHtml } from './list-pages';
import { parameterPageHtml } from './parameter-page';
import { PAGE_PATTERNS } from '../../../shared/paths';

/** Paths under /guides/ that are other pages, not guide slugs. */
const NOT_GUIDES = new Set(['new']);

/** A drawn page; null for "not found" (404, plain shell); 'plain' for a page the browser draws itself (200, plain shell). */
type Drawn = DrawnPage | null | 'plain';
type Draw = (user: User | null, url: string) => Promise<Drawn> | Drawn;

/**
 * A page with its compressed forms ready (a visitor's cached page) goes out as the form the browser
 * accepts (brotli first), with the ETag of the plain page, so no per-request compression is spent on it;
 * anything else is compressed per request by the compression middleware.
 */
function sendPage(req: Request, res: Response, page: DrawnPage) {
  res.type('html');
  if (!page.br && !page.gzip) return void res.send(page.html);
  const etagOf = req.app.get('etag fn') as ((body: string, encoding: string) => string) | undefined;
  if (etagOf) res.setHeader('ETag', etagOf(page.html, 'utf8'));
  res.vary('Accept-Encoding');
  // Ours first (brotli is smaller), whatever order the browser lists them in ("gzip, deflate, br, zstd").
  const chosen = (['br', 'gzip'] as const).find((e) => page[e] && req.acceptsEncodings(e) === e);
  const body = chosen && page[chosen];
  if (!chosen || !body) return void res.send(page.html);
  res.setHeader('Content-Encoding', chosen);
  res.send(body);
}

/**
 * Sends a page already drawn, with its data, so a reader sees it at first paint. Anything it cannot
 * draw (an unknown guide or entry, the database away) gets the plain shell and the browser takes over
 * as on every other page; it never answers with an error page of its own.
 */
async function sendDrawn(ctx: AppContext, shell: Shell, req: Request, res: Response, draw: Draw) {
  res.setHeader('Cache-Control', 'no-cache, private');
  res.setHeader('Vary', 'Cookie');
  try {
    const page = await draw((req.user as User | undefined) ?? null, req.originalUrl);
    if (page === null) return void res.status(404).type('html').send(shell.plain);
    if (page === 'plain') return void res.type('html').send(shell.plain);
    sendPage(req, res, page);
  } catch (err) {
    ctx.logger.warn({ err, path: req.path }, 'page could not be drawn on the server; sending the plain shell');
    res.type('html').send(shell.plain);
  }
}

/** /guides/:slug and /guides/:slug/v/:n; other /guides addresses (the editor, odd numbers) pass on. */
export function guidePageHandler(ctx: AppContext, shell: Shell): RequestHandler {
  return (req, res, next) => {
    const slug = slugSchema.safeParse(req.params.slug);
    const n = req.params.n === undefined ? null : Number(req.params.n);
    if (!slug.success || NOT_GUIDES.has(slug.data) || (n !== null && !(Number.isInteger(n) && n > 0 && n < 1e9))) return next();
    return sendDrawn(ctx, shell, req, res, (user, url) => guidePageHtml(ctx, shell, user, slug.data, n, url));
  };
}

/** /parameters/:slug, a parameter entry. */
export function parameterPageHandler(ctx: AppContext, shell: Shell): RequestHandler {
  return (req, res, next) => {
    const slug = slugSchema.safeParse(req.params.slug);
    if (!slug.success) return next();
    return sendDrawn(ctx, shell, req, res, (user, url) => parameterPageHtml(ctx, shell, user, slug.data, url));
  };
}

/** The home page, the parameter library, the guides list and search results. */
export function listPageHandlers(ctx: AppContext, shell: Shell): Record<string, RequestHandler> {
  const handle =
    (draw: (user: User | null, url: string) => ReturnType<Draw>): RequestHandler =>
    (req, res) =>
      sendDrawn(ctx, shell, req, res, draw);
  return {
    [PAGE_PATTERNS.home]: handle((user, url) => homePageHtml(ctx, shell, user, url)),
    [PAGE_PATTERNS.parameters]: handle((user, url) => parametersPageHtml(ctx, shell, user, url)),
    [PAGE_PATTERNS.guides]: handle(async (user, url) => (await guidesPageHtml(ctx, shell, user, url)) ?? 'plain'),
    [PAGE_PATTERNS.search]: handle((user, url) => searchPageHtml(ctx, shell, user, url) ?? 'plain'),
  };
}
