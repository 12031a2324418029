import type { MigrationInterface, QueryRunner } from 'typeorm';

export class InitialSchema1764633600000 implements MigrationInterface {
  name = 'InitialSchema1764633600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE EXTENSION IF NOT EXISTS pgcrypto`);
    await q.query(`
      CREATE TABLE users (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        email text NOT NULL UNIQUE CHECK (email = lower(email)),
        display_name text NOT NULL,
        password_hash text NOT NULL,
        role text NOT NULL DEFAULT 'member' CHECK (role IN ('member','moderator','admin')),
        email_verified_at timestamptz,
        disabled_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE user_tokens (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        purpose text NOT NULL CHECK (purpose IN ('verify_email','reset_password')),
        token_hash text NOT NULL UNIQUE,
        expires_at timestamptz NOT NULL,
        used_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX user_tokens_user_idx ON user_tokens (user_id, purpose)`);
    // The session table in the layout connect-pg-simple expects.
    await q.query(`
      CREATE TABLE session (
        sid varchar NOT NULL PRIMARY KEY,
        sess json NOT NULL,
        expire timestamp(6) NOT NULL
      )`);
    await q.query(`CREATE INDEX session_expire_idx ON session (expire)`);
    await q.query(`CREATE INDEX session_user_idx ON session (((sess -> 'passport') ->> 'user'))`);
    await q.query(`
      CREATE TABLE outbox (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        to_address text NOT NULL,
        subject text NOT NULL,
        text_body text NOT NULL,
        html_body text,
        attempts integer NOT NULL DEFAULT 0,
        last_error text,
        next_attempt_at timestamptz NOT NULL DEFAULT now(),
        sent_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX outbox_pending_idx ON outbox (next_attempt_at) WHERE sent_at IS NULL`);
    await q.query(`
      CREATE TABLE captured_mail (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        to_address text NOT NULL,
        from_address text NOT NULL,
        subject text NOT NULL,
        text_body text NOT NULL,
        html_body text,
        received_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE audit_log (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
        action text NOT NULL,
        subject_kind text NOT NULL,
        subject_id uuid NOT NULL,
        from_value text,
        to_value text,
        reason text,
        meta jsonb NOT NULL DEFAULT '{}'::jsonb,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX audit_log_subject_idx ON audit_log (subject_kind, subject_id, created_at)`);
    await q.query(`
      CREATE TABLE documents (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        kind text NOT NULL CHECK (kind IN ('guide','parameter')),
        slug text NOT NULL,
        published_revision_id uuid,
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        hidden_at timestamptz,
        hidden_by uuid REFERENCES users(id) ON DELETE SET NULL,
        hidden_reason text,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (kind, slug)
      )`);
    await q.query(`
      CREATE TABLE revisions (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        document_id uuid NOT NULL REFERENCES documents(id) ON DELETE CASCADE,
        number integer NOT NULL CHECK (number > 0),
        base_revision_id uuid REFERENCES revisions(id),
        author_id uuid NOT NULL REFERENCES users(id),
        state text NOT NULL CHECK (state IN ('draft','in_review','published','returned','archived')),
        note text NOT NULL DEFAULT '',
        reason text,
        content jsonb NOT NULL,
        setup jsonb,
        restored_from_number integer,
        submitted_at timestamptz,
        reviewed_by uuid REFERENCES users(id),
        reviewed_at timestamptz,
        published_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (document_id, number),
        CHECK (state <> 'returned' OR reason IS NOT NULL)
      )`);
    // At most one live revision per document.
    await q.query(`CREATE UNIQUE INDEX revisions_one_published ON revisions (document_id) WHERE state = 'published'`);
    await q.query(`CREATE INDEX revisions_state_idx ON revisions (state, submitted_at)`);
    await q.query(`CREATE INDEX revisions_author_idx ON revisions (author_id, updated_at)`);
    await q.query(`
      ALTER TABLE documents ADD CONSTRAINT documents_published_revision_fk
      FOREIGN KEY (published_revision_id) REFERENCES revisions(id) DEFERRABLE INITIALLY DEFERRED`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE documents DROP CONSTRAINT documents_published_revision_fk`);
    for (const t of ['revisions', 'documents', 'audit_log', 'captured_mail', 'outbox', 'session', 'user_tokens', 'users']) {
      await q.query(`DROP TABLE IF EXISTS ${t}`);
    }
  }
}
