import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import type { RequestHandler } from 'express';
import { pinoHttp } from 'pino-http';
import type { Logger } from '../lib/logger';

// An id a proxy in front already gave the request is kept (so its logs and ours line up), if it looks like one.
const ACCEPTABLE_ID = /^[A-Za-z0-9._:-]{8,100}$/;

/**
 * One line per request: method, path, status, time taken, request id and the signed-in account's id —
 * no headers, cookies or bodies. Static assets are not logged. The level follows LOG_LEVEL.
 */
export function requestLog(logger: Logger): RequestHandler {
  return pinoHttp({
    logger,
    genReqId: (req, res) => {
      const given = req.headers['x-request-id'];
      const id = typeof given === 'string' && ACCEPTABLE_ID.test(given) ? given : randomUUID();
      res.setHeader('X-Request-Id', id);
      return id;
    },
    autoLogging: { ignore: (req) => req.url?.startsWith('/assets/') ?? false },
    quietReqLogger: true,
    customSuccessMessage: (req, res, ms) => `${req.method} ${pathOf(req)} ${res.statusCode} ${Math.round(ms)} ms`,
    customErrorMessage: (req, res) => `${req.method} ${pathOf(req)} ${res.statusCode} failed`,
    customProps: (req) => ({ userId: (req as IncomingMessage & { user?: { id: string } }).user?.id ?? null }),
    serializers: {
      req: (req: IncomingMessage & { id?: string }) => ({ id: req.id, method: req.method, path: pathOf(req) }),
      res: (res: ServerResponse) => ({ status: res.statusCode }),
    },
    wrapSerializers: false,
  }) as unknown as RequestHandler;
}

/** The path without the query string (queries can carry search words and tokens). */
function pathOf(req: IncomingMessage) {
  const url = (req as IncomingMessage & { originalUrl?: string }).originalUrl ?? req.url ?? '';
  return url.split('?')[0];
}
