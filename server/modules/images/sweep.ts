import type { DataSource } from 'typeorm';
import type { Logger } from '../../lib/logger';
import type { Storage } from '../../lib/storage';

/**
 * How long an image nobody refers to is kept after its draft has gone or been published without it:
 * long enough for an author who cut an image from the text to paste it back.
 */
export const IMAGE_SWEEP_GRACE_MS = 24 * 60 * 60 * 1000;

/** SQL for the storage sweep: which of the keys in $1 an image row still points at. */
export const IMAGE_KEYS_SQL = `SELECT v->>'key' AS storage_key FROM images, jsonb_array_elements(variants) v WHERE v->>'key' = ANY($1)`;

/**
 * Removes images no revision refers to whose draft is gone (or was published without them), once they are
 * older than the grace: rows first (in one statement, so an image a revision starts to use meanwhile is kept
 * by the NOT EXISTS seen at that instant), then their objects. An image in a draft, in review or sent back
 * stays with that revision; one any revision uses stays for as long as that revision exists.
 */
export async function sweepImages(deps: { dataSource: DataSource; storage: Storage; logger: Logger }, olderThan: Date) {
  const rows: Array<{ id: string; variants: Array<{ key: string }> }> = await deps.dataSource
    .query(
      `DELETE FROM images i
      WHERE i.created_at < $1
        AND NOT EXISTS (SELECT 1 FROM revision_images ri WHERE ri.image_id = i.id)
        AND NOT EXISTS (SELECT 1 FROM revisions r WHERE r.id = i.revision_id AND r.state IN ('draft', 'in_review', 'returned'))
      RETURNING i.id, i.variants`,
      [olderThan],
    )
    .then((res: unknown) => (Array.isArray(res) && Array.isArray(res[0]) ? res[0] : res) as Array<{ id: string; variants: Array<{ key: string }> }>);
  for (const row of rows)
    for (const v of row.variants)
      await deps.storage.delete(v.key).catch((err) => deps.logger.error({ err, key: v.key }, 'could not remove a swept image object'));
  return rows.map((r) => r.id);
}
