import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * First approvals of proposals that need two moderators (issue #13: safety-relevant baseline changes).
 * One row per moderator per revision, so the same moderator approving twice stays one approval; rows
 * go when the revision is withdrawn, returned or submitted again, so an approval always covers the text
 * it was given for.
 */
export class ReviewApprovals1796190000000 implements MigrationInterface {
  name = 'ReviewApprovals1796190000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE review_approvals (
        revision_id uuid NOT NULL REFERENCES revisions(id) ON DELETE CASCADE,
        moderator_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        created_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (revision_id, moderator_id)
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS review_approvals`);
  }
}
