import { rateLimit } from 'express-rate-limit';
import type { Config } from '../config/env';

function limiter(limit: number, message: string) {
  return rateLimit({
    windowMs: 15 * 60_000,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, res, _next, options) => {
      res.setHeader('Retry-After', Math.ceil(options.windowMs / 1000));
      res.status(429).json({ error: { code: 'rate_limited', message } });
    },
  });
}

/** One limiter per bucket; each app instance keeps its own counts. */
export function createLimiters(config: Config) {
  return {
    auth: limiter(config.rateLimits.authPer15Min, 'Too many attempts from this address. Wait a few minutes and try again.'),
    upload: limiter(config.rateLimits.uploadPer15Min, 'Too many uploads from this address. Wait a few minutes and try again.'),
  };
}
