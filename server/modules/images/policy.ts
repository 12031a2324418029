import type { DataSource, EntityManager } from 'typeorm';
import { isModerator, type Actor } from '../revisions/policy';

type ImageFacts = { id: string; ownerId: string; documentId: string; hiddenAt: Date | null };

/**
 * Moderators see every image (hidden ones too, to judge them). Otherwise a hidden image is gone; its
 * author sees their own; anyone else only once a live revision of a visible document uses it.
 */
export async function canSeeImage(db: DataSource | EntityManager, actor: Actor, image: ImageFacts): Promise<boolean> {
  if (isModerator(actor)) return true;
  if (image.hiddenAt) return false;
  if (actor && actor.id === image.ownerId) return true;
  return isPublicImage(db, image);
}

/** True when the live revision of the image's own document (not hidden) refers to it. */
export async function isPublicImage(db: DataSource | EntityManager, image: Pick<ImageFacts, 'id' | 'documentId' | 'hiddenAt'>): Promise<boolean> {
  if (image.hiddenAt) return false;
  const rows: unknown[] = await db.query(
    `SELECT 1 FROM revision_images ri JOIN documents d ON d.published_revision_id = ri.revision_id
      WHERE ri.image_id = $1 AND d.id = $2 AND d.hidden_at IS NULL LIMIT 1`,
    [image.id, image.documentId],
  );
  return rows.length > 0;
}
