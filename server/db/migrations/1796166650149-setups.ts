import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Members' uploaded setup records: the stored file's key plus the validated record. */
export class Setups1796166650149 implements MigrationInterface {
  name = 'Setups1796166650149';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE setups (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        owner_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        storage_key text NOT NULL UNIQUE,
        original_name text NOT NULL CHECK (length(original_name) BETWEEN 1 AND 120),
        file_format text NOT NULL CHECK (file_format IN ('json','csv')),
        byte_size integer NOT NULL CHECK (byte_size > 0),
        record jsonb NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX setups_owner_idx ON setups (owner_id, created_at DESC)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS setups`);
  }
}
