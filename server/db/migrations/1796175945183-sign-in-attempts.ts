import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Sign-in attempts per address in the current window, shared by every app instance (the per-IP limiter
 * is per instance). Keyed by a SHA-256 of the normalised address, so the table holds no typed addresses,
 * and counted whether or not an account has the address, so the limit tells nothing about who exists.
 */
export class SignInAttempts1796175945183 implements MigrationInterface {
  name = 'SignInAttempts1796175945183';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE sign_in_attempts (
        email_key text PRIMARY KEY CHECK (email_key ~ '^[0-9a-f]{64}$'),
        attempts integer NOT NULL CHECK (attempts > 0),
        window_started_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX sign_in_attempts_window_idx ON sign_in_attempts (window_started_at)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS sign_in_attempts`);
  }
}
