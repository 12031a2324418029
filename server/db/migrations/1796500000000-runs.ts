import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Members' run logs: stored file and columns by key, mapping, notes and figures. */
export class Runs1796500000000 implements MigrationInterface {
  name = 'Runs1796500000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE runs (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        owner_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        setup_id uuid REFERENCES setups(id) ON DELETE SET NULL,
        title text NOT NULL CHECK (length(title) BETWEEN 1 AND 120),
        original_name text NOT NULL CHECK (length(original_name) BETWEEN 1 AND 120),
        byte_size integer NOT NULL CHECK (byte_size > 0),
        raw_key text NOT NULL UNIQUE,
        data_key text NOT NULL UNIQUE,
        data_bytes integer NOT NULL CHECK (data_bytes > 0),
        channels jsonb NOT NULL,
        mapping jsonb NOT NULL,
        import_notes jsonb NOT NULL,
        gaps jsonb NOT NULL,
        summary jsonb NOT NULL,
        demo boolean NOT NULL DEFAULT false,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX runs_owner_idx ON runs (owner_id, created_at DESC)`);
    // Runs offered as evidence on a guide revision; public only while that revision is the live one.
    await q.query(`
      CREATE TABLE run_evidence (
        revision_id uuid NOT NULL REFERENCES revisions(id) ON DELETE CASCADE,
        run_id uuid NOT NULL REFERENCES runs(id) ON DELETE CASCADE,
        created_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (revision_id, run_id)
      )`);
    await q.query(`CREATE INDEX run_evidence_run_idx ON run_evidence (run_id)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS run_evidence`);
    await q.query(`DROP TABLE IF EXISTS runs`);
  }
}
