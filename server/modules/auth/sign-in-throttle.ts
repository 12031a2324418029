import crypto from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import { AppError } from '../../lib/errors';

/** The window the per-account budget counts over; it starts with the first attempt and does not slide. */
export const SIGN_IN_WINDOW_MS = 15 * 60_000;

/** The row key for an address: a hash of the normalised address (the table never holds what people typed). */
export const signInKey = (email: string) => crypto.createHash('sha256').update(email.trim().toLowerCase()).digest('hex');

/** 429 once an address has used its sign-in attempts; the same for every address, with or without an account. */
export function signInThrottled(retryAfterSeconds: number) {
  const minutes = Math.max(1, Math.ceil(retryAfterSeconds / 60));
  return new AppError(
    429,
    'sign_in_throttled',
    `Too many sign-in attempts for this e-mail address. Wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again, or reset your password to sign in straight away.`,
    { retryAfterSeconds },
  );
}

/**
 * Per-account limit on sign-in attempts, in PostgreSQL so every app instance counts the same budget
 * (the per-IP limiter counts per instance and does nothing against many addresses guessing one account).
 * An attempt is counted before the password is checked, so parallel guesses cannot slip past the limit;
 * a successful sign-in or a password reset clears the count.
 */
export function signInThrottle(db: DataSource | EntityManager, limit: number) {
  const window = `${SIGN_IN_WINDOW_MS} milliseconds`;
  return {
    /** Counts one attempt for the address; throws 429 `sign_in_throttled` once the window's budget is spent. */
    async reserve(email: string) {
      const [row]: Array<{ attempts: number; retry_after: string; fresh: boolean }> = await db.query(
        `INSERT INTO sign_in_attempts AS a (email_key, attempts, window_started_at) VALUES ($1, 1, now())
         ON CONFLICT (email_key) DO UPDATE SET
           attempts = CASE WHEN a.window_started_at <= now() - $2::interval THEN 1 ELSE a.attempts + 1 END,
           window_started_at = CASE WHEN a.window_started_at <= now() - $2::interval THEN now() ELSE a.window_started_at END
         RETURNING attempts, EXTRACT(EPOCH FROM (window_started_at + $2::interval - now())) AS retry_after, attempts = 1 AS fresh`,
        [signInKey(email), window],
      );
      // A new window is a good moment to drop rows whose window ended long ago (the index keeps it cheap).
      if (row.fresh) await db.query(`DELETE FROM sign_in_attempts WHERE window_started_at < now() - $1::interval`, [window]);
      if (row.attempts > limit) throw signInThrottled(Math.max(1, Math.ceil(Number(row.retry_after))));
    },
    /** Forgets the address's attempts (after a successful sign-in or a password reset). */
    async clear(email: string) {
      await db.query(`DELETE FROM sign_in_attempts WHERE email_key = $1`, [signInKey(email)]);
    },
  };
}
