import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Deleting one's account (#16) and fixing a sent-back revision: `users.deleted_at` marks an account
 * whose person left (the row stays, under a neutral name, so published versions keep an author to
 * credit); `revisions.returned_snapshot` keeps what the moderator sent back (content, baseline,
 * reason), so the review screen can show what the author changed since.
 */
export class AccountDeletionAndReturns1797200000001 implements MigrationInterface {
  name = 'AccountDeletionAndReturns1797200000001';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE users ADD COLUMN deleted_at timestamptz`);
    await q.query(`ALTER TABLE revisions ADD COLUMN returned_snapshot jsonb`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE revisions DROP COLUMN IF EXISTS returned_snapshot`);
    await q.query(`ALTER TABLE users DROP COLUMN IF EXISTS deleted_at`);
  }
}
