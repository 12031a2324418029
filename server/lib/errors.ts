import type { FieldIssue } from '../../shared/schemas/common';

/** An error with an HTTP status and a stable code, rendered in the one error shape. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

export const notFound = (what = 'That page') => new AppError(404, 'not_found', `${what} was not found`);
export const unauthenticated = () => new AppError(401, 'unauthenticated', 'Sign in to do that');
export const forbidden = (message = 'You are not allowed to do that') => new AppError(403, 'forbidden', message);
export const conflict = (code: string, message: string, details?: unknown) => new AppError(409, code, message, details);
export const validationFailed = (issues: FieldIssue[], message = 'Some fields need attention') => new AppError(400, 'validation_failed', message, issues);

/** True when an error means PostgreSQL could not be reached (so the client gets 503, not 500). */
export function isDbUnavailable(err: unknown): boolean {
  if (!err || typeof err !== 'object') return false;
  const e = err as { code?: string; message?: string; driverError?: unknown };
  if (e.driverError && isDbUnavailable(e.driverError)) return true;
  // TypeORM releases a transaction's connection when PostgreSQL drops it; the COMMIT then fails with this.
  if ((err as { name?: string }).name === 'QueryRunnerAlreadyReleasedError') return true;
  const codes = ['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', '57P01', '57P02', '57P03', '08000', '08003', '08006', '08001', '08004'];
  if (e.code && codes.includes(e.code)) return true;
  const msg = e.message ?? '';
  return /Connection terminated|connect ECONNREFUSED|timeout exceeded when trying to connect|Client has encountered a connection error|the database system is (starting up|shutting down)|terminating connection/i.test(
    msg,
  );
}
