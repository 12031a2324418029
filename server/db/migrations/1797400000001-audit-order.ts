import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The audit log page (#16): rows written in one transaction share created_at (now() is the
 * transaction's start), so a running number gives them a stable order (a publish after the archive it
 * caused). Existing rows are numbered as they are stored. The actor filter gets an index of its own.
 */
export class AuditOrder1797400000001 implements MigrationInterface {
  name = 'AuditOrder1797400000001';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE audit_log ADD COLUMN seq bigserial`);
    await q.query(`CREATE INDEX audit_log_created_seq_idx ON audit_log (created_at DESC, seq DESC)`);
    await q.query(`CREATE INDEX audit_log_actor_created_idx ON audit_log (actor_id, created_at DESC)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX IF EXISTS audit_log_actor_created_idx`);
    await q.query(`DROP INDEX IF EXISTS audit_log_created_seq_idx`);
    await q.query(`ALTER TABLE audit_log DROP COLUMN IF EXISTS seq`);
  }
}
