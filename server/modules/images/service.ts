import { In, type DataSource, type EntityManager } from 'typeorm';
import { IMAGE_LIMITS, imageSrcset, imageUrl, defaultWidth } from '../../../shared/markdown/images';
import type { UploadedImage } from '../../../shared/schemas/image';
import type { AppContext } from '../../context';
import { AppError, notFound } from '../../lib/errors';
import { newStorageKey } from '../../lib/storage';
import { RevisionEntity } from '../revisions/revision.entity';
import { DocumentEntity } from '../revisions/document.entity';
import { isModerator, mayEdit, type Actor } from '../revisions/policy';
import { ImageEntity, type ImageVariant } from './image.entity';
import { canSeeImage, isPublicImage } from './policy';
import { invalidImage, processImage } from './process';
import { notifyDocumentChanged } from '../../lib/document-events';

type Db = DataSource | EntityManager;

const refuse = (d: ReturnType<typeof mayEdit>) => {
  if (!d.ok) throw new AppError(d.status, d.code, d.message);
};

export function presentUploadedImage(row: Pick<ImageEntity, 'id' | 'width' | 'height'>): UploadedImage {
  return { id: row.id, url: imageUrl(row.id, defaultWidth(row.width)), width: row.width, height: row.height, srcset: imageSrcset(row.id, row.width) };
}

/**
 * An image uploaded into the author's own draft: the revision is checked first (so no one else's upload
 * is even decoded), then the file is decoded and re-encoded, the widths stored, and the row written with
 * the revision locked. Objects first, row second; the objects are removed again if the row fails.
 */
export async function uploadImage(ctx: AppContext, actor: NonNullable<Actor>, revisionId: string, file: Express.Multer.File | undefined) {
  const rev = await ctx.dataSource.getRepository(RevisionEntity).findOneBy({ id: revisionId });
  if (!rev) throw notFound('That revision');
  refuse(mayEdit(actor, rev));
  if (!file) throw invalidImage(400, 'Attach an image.', 'Send the image in the multipart field "file"');
  const processed = await processImage(file.buffer);
  const ext = processed.format === 'png' ? 'png' : 'jpg';
  const contentType = processed.format === 'png' ? 'image/png' : 'image/jpeg';
  const variants: ImageVariant[] = processed.variants.map((v) => ({
    width: v.width,
    height: v.height,
    key: newStorageKey('images', ext),
    bytes: v.body.length,
  }));
  try {
    for (const [i, v] of processed.variants.entries()) await ctx.storage.put(variants[i].key, v.body, contentType);
    const row = await ctx.dataSource.transaction(async (m) => {
      const locked = await m.getRepository(RevisionEntity).findOne({ where: { id: revisionId }, lock: { mode: 'pessimistic_write' } });
      if (!locked) throw notFound('That revision');
      refuse(mayEdit(actor, locked));
      const count = await m.getRepository(ImageEntity).countBy({ revisionId });
      if (count >= IMAGE_LIMITS.perRevision)
        throw new AppError(409, 'too_many_images', `A revision holds at most ${IMAGE_LIMITS.perRevision} uploaded images; remove some you no longer use.`);
      const repo = m.getRepository(ImageEntity);
      return repo.save(
        repo.create({
          ownerId: actor.id,
          documentId: locked.documentId,
          revisionId,
          width: processed.width,
          height: processed.height,
          format: processed.format,
          variants,
          byteSize: file.buffer.length,
          hiddenAt: null,
          hiddenBy: null,
          hiddenReason: null,
        }),
      );
    });
    return row;
  } catch (err) {
    for (const v of variants)
      await ctx.storage.delete(v.key).catch((e) => ctx.logger.error({ err: e, key: v.key }, 'could not remove an orphaned image object'));
    throw err;
  }
}

/** The stored bytes of one width of an image the caller may see (404 otherwise, word for word as for an unknown id). */
export async function readImage(ctx: AppContext, actor: Actor, id: string, width: number) {
  const row = await ctx.dataSource.getRepository(ImageEntity).findOneBy({ id });
  if (!row || !(await canSeeImage(ctx.dataSource, actor, row))) throw notFound('That image');
  const variant = row.variants.find((v) => v.width === width);
  if (!variant) throw notFound('That image');
  const body = await ctx.storage.get(variant.key);
  if (!body) throw new Error(`stored image ${variant.key} is missing`);
  // Public means anyone may keep it: a live revision refers to it. Drafts' images are the author's and the moderators' only.
  const shared = await isPublicImage(ctx.dataSource, row);
  return { body, contentType: row.format === 'png' ? 'image/png' : 'image/jpeg', shared };
}

/** A moderator hides (or shows again) one image; pages using it show a notice instead, the guide stays up. */
export async function setImageHidden(ctx: AppContext, actor: NonNullable<Actor>, id: string, hide: boolean, reason: string | null) {
  if (!isModerator(actor)) throw new AppError(403, 'forbidden', 'Only moderators can hide images');
  return ctx.dataSource.transaction(async (m) => {
    const repo = m.getRepository(ImageEntity);
    const row = await repo.findOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
    if (!row) throw notFound('That image');
    if (hide && row.hiddenAt) throw new AppError(409, 'invalid_transition', 'That image is already hidden');
    if (!hide && !row.hiddenAt) throw new AppError(409, 'invalid_transition', 'That image is not hidden');
    const patch = hide ? { hiddenAt: new Date(), hiddenBy: actor.id, hiddenReason: reason } : { hiddenAt: null, hiddenBy: null, hiddenReason: null };
    await repo.update({ id }, patch);
    await m.query(`INSERT INTO audit_log (actor_id, action, subject_kind, subject_id, reason, meta) VALUES ($1, $2, 'image', $3, $4, $5)`, [
      actor.id,
      hide ? 'image.hide' : 'image.unhide',
      id,
      reason,
      JSON.stringify({ documentId: row.documentId }),
    ]);
    // Live pages render the notice in place of the image: tell every instance to draw them again.
    const doc = await m.getRepository(DocumentEntity).findOneBy({ id: row.documentId });
    if (doc) await notifyDocumentChanged(m, { kind: doc.kind, documentId: doc.id, slug: doc.slug, action: hide ? 'hidden' : 'unhidden' });
    const fresh = await repo.findOneByOrFail({ id });
    return { id: fresh.id, hiddenAt: fresh.hiddenAt?.toISOString() ?? null, hiddenReason: fresh.hiddenReason };
  });
}

/** Ids among these that a moderator has hidden (pages replace them with a notice). */
export async function hiddenImageIds(db: Db, ids: string[]): Promise<Set<string>> {
  if (!ids.length) return new Set();
  const rows = await db.getRepository(ImageEntity).find({ where: { id: In(ids) }, select: { id: true, hiddenAt: true } });
  return new Set(rows.filter((r) => r.hiddenAt).map((r) => r.id));
}
