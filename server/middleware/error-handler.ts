import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { AppError, isDbUnavailable } from '../lib/errors';
import { toFieldIssues } from '../lib/route';
import type { Logger } from '../lib/logger';
import { csrf } from './csrf';

type Shaped = { status: number; code: string; message: string; details?: unknown };

function shape(err: unknown): Shaped | null {
  if (err instanceof AppError) return { status: err.status, code: err.code, message: err.message, details: err.details };
  if (err instanceof ZodError) return { status: 400, code: 'validation_failed', message: 'Some fields need attention', details: toFieldIssues(err) };
  if (err === csrf.invalidCsrfTokenError || (err as { code?: string })?.code === 'EBADCSRFTOKEN') {
    return { status: 403, code: 'csrf_invalid', message: 'Your session token is missing or out of date. Reload the page and try again.' };
  }
  const e = err as { type?: string; status?: number; code?: string; message?: string; field?: string };
  if (e?.type === 'entity.too.large' || e?.code === 'LIMIT_FILE_SIZE')
    return { status: 413, code: 'payload_too_large', message: 'That is too large to accept.' };
  if (e?.type === 'entity.parse.failed') return { status: 400, code: 'invalid_json', message: 'The request body is not valid JSON.' };
  if (e?.type === 'charset.unsupported' || e?.type === 'encoding.unsupported')
    return { status: 415, code: 'unsupported_media_type', message: 'That character set or encoding is not supported.' };
  if (typeof e?.code === 'string' && e.code.startsWith('LIMIT_'))
    return {
      status: 400,
      code: 'invalid_upload',
      message: e.message ?? 'The upload was refused.',
      details: e.field ? [{ path: e.field, message: e.message }] : undefined,
    };
  if (e?.status && e.status >= 400 && e.status < 500) return { status: e.status, code: 'bad_request', message: 'The request could not be understood.' };
  // Text PostgreSQL cannot store (a NUL, an invalid escape) is the caller's input, not our failure.
  const pgCode = (err as { driverError?: { code?: string }; code?: string })?.driverError?.code ?? e?.code;
  if (pgCode === '22021' || pgCode === '22P05') return { status: 400, code: 'invalid_text', message: 'The request contains characters that cannot be stored.' };
  if (isDbUnavailable(err)) return { status: 503, code: 'db_unavailable', message: 'The database is unavailable right now. Try again in a moment.' };
  return null;
}

/** Renders every failure in the one error shape; unknown errors become internal_error without a stack trace. */
export function errorHandler(logger: Logger): ErrorRequestHandler {
  return (err, req, res, _next) => {
    const s = shape(err) ?? { status: 500, code: 'internal_error', message: 'Something went wrong on our side. It has been logged.' };
    if (s.status >= 500) logger.error({ err, url: req.originalUrl, method: req.method }, 'request failed');
    if (res.headersSent) return void res.end();
    if (s.status === 503) res.setHeader('Retry-After', '5');
    const body: { error: { code: string; message: string; details?: unknown } } = { error: { code: s.code, message: s.message } };
    if (s.details !== undefined) body.error.details = s.details;
    res.status(s.status).json(body);
  };
}

export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ error: { code: 'not_found', message: `No API route ${req.method} ${req.path}` } });
};

/**
 * A file of the build (or of the public folder) that is not there: most often a chunk of an older build that a
 * page opened before a deployment asks for. It gets a 404 in the error shape, never the app's HTML page: a
 * browser must not run HTML as a script or stylesheet, and the page's import fails cleanly (the app then
 * reloads into the new build). Not stored by caches either: the file may appear with the next deployment.
 */
export const BUILD_FILE = /^\/assets\/|\.(?:js|mjs|css|map|woff2?|json|webmanifest|png|svg|ico|webp|jpe?g|txt)$/i;
export const buildFileNotFound: RequestHandler = (req, res, next) => {
  if ((req.method !== 'GET' && req.method !== 'HEAD') || !BUILD_FILE.test(req.path)) return next();
  res.setHeader('Cache-Control', 'no-store');
  res.status(404).json({ error: { code: 'not_found', message: `No file ${req.path} in this version of Tunewright` } });
};
