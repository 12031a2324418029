import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Images in guides and parameter entries (#19): one row per processed upload with its stored widths, and
 * which revisions refer to it. `revision_images` is kept by a trigger from each revision's content, so
 * every way a revision gets content (autosave, submit, restore, the seed) records its images the same way.
 */
export class Images1796600000000 implements MigrationInterface {
  name = 'Images1796600000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE images (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        owner_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        document_id uuid NOT NULL REFERENCES documents(id) ON DELETE CASCADE,
        revision_id uuid REFERENCES revisions(id) ON DELETE SET NULL,
        width integer NOT NULL CHECK (width > 0),
        height integer NOT NULL CHECK (height > 0),
        format text NOT NULL CHECK (format IN ('jpeg', 'png')),
        variants jsonb NOT NULL,
        byte_size integer NOT NULL CHECK (byte_size > 0),
        hidden_at timestamptz,
        hidden_by uuid REFERENCES users(id) ON DELETE SET NULL,
        hidden_reason text,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX images_revision_idx ON images (revision_id)`);
    await q.query(`CREATE INDEX images_document_idx ON images (document_id)`);
    await q.query(`
      CREATE TABLE revision_images (
        revision_id uuid NOT NULL REFERENCES revisions(id) ON DELETE CASCADE,
        image_id uuid NOT NULL REFERENCES images(id) ON DELETE CASCADE,
        PRIMARY KEY (revision_id, image_id)
      )`);
    await q.query(`CREATE INDEX revision_images_image_idx ON revision_images (image_id)`);
    await q.query(`
      CREATE FUNCTION revision_images_sync() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        DELETE FROM revision_images WHERE revision_id = NEW.id;
        INSERT INTO revision_images (revision_id, image_id)
          SELECT DISTINCT NEW.id, i.id FROM images i
           WHERE i.id IN (
             SELECT m[1]::uuid FROM regexp_matches(NEW.content::text,
               '/api/images/([0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})/', 'g') AS m);
        RETURN NULL;
      END $$`);
    await q.query(`CREATE TRIGGER revisions_images_sync AFTER INSERT OR UPDATE OF content ON revisions FOR EACH ROW EXECUTE FUNCTION revision_images_sync()`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TRIGGER IF EXISTS revisions_images_sync ON revisions`);
    await q.query(`DROP FUNCTION IF EXISTS revision_images_sync()`);
    await q.query(`DROP TABLE IF EXISTS revision_images`);
    await q.query(`DROP TABLE IF EXISTS images`);
  }
}
