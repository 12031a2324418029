import { csrfSync } from 'csrf-sync';
import type { Request } from 'express';

/** Synchronizer-token CSRF protection: token from GET /api/csrf, echoed in the x-csrf-token header. */
export const csrf = csrfSync({
  getTokenFromRequest: (req: Request) => {
    const value = req.headers['x-csrf-token'];
    return Array.isArray(value) ? value[0] : value;
  },
});
