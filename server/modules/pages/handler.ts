import type { RequestHandler } from 'express';
import { slugSchema } from '../../../shared/schemas/common';
import type { User } from '../../../shared/schemas/user';
import type { AppContext } from '../../context';
import type { Shell } from '../../lib/html-shell';
import { guidePageHtml } from './guide-page';

/** Paths under /guides/ that are other pages, not guide slugs. */
const NOT_GUIDES = new Set(['new']);

/**
 * Serves a guide page already drawn, with its data, so a reader sees the guide at first paint. Anything
 * it cannot draw (an unknown guide, a broken address, the database away) gets the plain shell and the
 * browser takes over as on every other page; it never answers with an error page of its own.
 */
export function guidePageHandler(ctx: AppContext, shell: Shell): RequestHandler {
  return async (req, res, next) => {
    const slug = slugSchema.safeParse(req.params.slug);
    const n = req.params.n === undefined ? null : Number(req.params.n);
    if (!slug.success || NOT_GUIDES.has(slug.data) || (n !== null && !(Number.isInteger(n) && n > 0 && n < 1e9))) return next();
    res.setHeader('Cache-Control', 'no-cache, private');
    res.setHeader('Vary', 'Cookie');
    try {
      const html = await guidePageHtml(ctx, shell, (req.user as User | undefined) ?? null, slug.data, n, req.originalUrl);
      if (html === null) return void res.status(404).type('html').send(shell.plain);
      res.type('html').send(html);
    } catch (err) {
      ctx.logger.warn({ err, path: req.path }, 'guide page could not be drawn on the server; sending the plain shell');
      res.type('html').send(shell.plain);
    }
  };
}
