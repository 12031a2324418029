import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Following what changes (#16): who watches which guide or parameter entry, how each person wants
 * those mails (at once, a daily digest, or none), the changes waiting for the next digest, and mail
 * headers in the outbox (List-Unsubscribe) and the local catcher.
 */
export class Watches1796700000000 implements MigrationInterface {
  name = 'Watches1796700000000';

  async up(q: QueryRunner): Promise<void> {
    // A row with watching = false remembers that someone stopped watching, so authoring another
    // version does not quietly sign them up again.
    await q.query(`
      CREATE TABLE watches (
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        document_id uuid NOT NULL REFERENCES documents(id) ON DELETE CASCADE,
        watching boolean NOT NULL DEFAULT true,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (user_id, document_id)
      )`);
    await q.query(`CREATE INDEX watches_document_idx ON watches (document_id) WHERE watching`);
    await q.query(`
      CREATE TABLE watch_preferences (
        user_id uuid PRIMARY KEY REFERENCES users(id) ON DELETE CASCADE,
        delivery text NOT NULL DEFAULT 'immediate' CHECK (delivery IN ('immediate', 'daily', 'off')),
        last_digest_at timestamptz
      )`);
    await q.query(`
      CREATE TABLE watch_digest_items (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        document_id uuid NOT NULL REFERENCES documents(id) ON DELETE CASCADE,
        change jsonb NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX watch_digest_items_user_idx ON watch_digest_items (user_id, created_at)`);
    await q.query(`ALTER TABLE outbox ADD COLUMN headers jsonb`);
    await q.query(`ALTER TABLE captured_mail ADD COLUMN headers jsonb`);
    // The recent-changes list and the audit log read audit rows newest first, by action.
    await q.query(`CREATE INDEX IF NOT EXISTS audit_log_created_idx ON audit_log (created_at DESC)`);
    await q.query(`CREATE INDEX IF NOT EXISTS audit_log_action_created_idx ON audit_log (action, created_at DESC)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX IF EXISTS audit_log_action_created_idx`);
    await q.query(`DROP INDEX IF EXISTS audit_log_created_idx`);
    await q.query(`ALTER TABLE captured_mail DROP COLUMN IF EXISTS headers`);
    await q.query(`ALTER TABLE outbox DROP COLUMN IF EXISTS headers`);
    await q.query(`DROP TABLE IF EXISTS watch_digest_items`);
    await q.query(`DROP TABLE IF EXISTS watch_preferences`);
    await q.query(`DROP TABLE IF EXISTS watches`);
  }
}
