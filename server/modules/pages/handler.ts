import type { Request, RequestHandler, Response } from 'express';
import { slugSchema } from '../../../shared/schemas/common';
import type { User } from '../../../shared/schemas/user';
import type { AppContext } from '../../context';
import type { Shell } from '../../lib/html-shell';
import { guidePageHtml } from './guide-page';
import { parameterPageHtml } from './parameter-page';

/** Paths under /guides/ that are other pages, not guide slugs. */
const NOT_GUIDES = new Set(['new']);

type Draw = (user: User | null, url: string) => Promise<string | null>;

/**
 * Sends a page already drawn, with its data, so a reader sees it at first paint. Anything it cannot
 * draw (an unknown guide or entry, the database away) gets the plain shell and the browser takes over
 * as on every other page; it never answers with an error page of its own.
 */
async function sendDrawn(ctx: AppContext, shell: Shell, req: Request, res: Response, draw: Draw) {
  res.setHeader('Cache-Control', 'no-cache, private');
  res.setHeader('Vary', 'Cookie');
  try {
    const html = await draw((req.user as User | undefined) ?? null, req.originalUrl);
    if (html === null) return void res.status(404).type('html').send(shell.plain);
    res.type('html').send(html);
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
