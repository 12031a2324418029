import type { Image, ImageReference, Root } from 'mdast';
import remarkGfm from 'remark-gfm';
import remarkParse from 'remark-parse';
import { unified } from 'unified';
import { visit } from 'unist-util-visit';
import { In, type EntityManager } from 'typeorm';
import { IMAGE_LIMITS, parseImageSrc } from '../../../shared/markdown/images';
import { AppError } from '../../lib/errors';
import { ImageEntity } from './image.entity';

export type ImageProblem = { path: string; message: string; image: string };

/** The content fields drawn as Markdown (titles, summaries, conditions and tags are shown as plain text). */
const MARKDOWN_FIELDS = ['body'] as const;

/** Every image in the Markdown fields of a revision's content, as the renderers will see them. */
export function imagesInContent(content: Record<string, unknown>) {
  const found: Array<{ field: string; alt: string; url: string | null }> = [];
  const parser = unified().use(remarkParse).use(remarkGfm);
  for (const field of MARKDOWN_FIELDS) {
    const value = content[field];
    if (typeof value !== 'string' || !value.includes('![')) continue;
    const tree = parser.parse(value) as Root;
    visit(tree, (node) => {
      if (node.type === 'image') found.push({ field, alt: (node as Image).alt ?? '', url: (node as Image).url });
      if (node.type === 'imageReference') found.push({ field, alt: (node as ImageReference).alt ?? '', url: null });
    });
  }
  return found;
}

/**
 * What stops a revision with images from going to review: an image without alt text (readers who cannot
 * see it get nothing), one that is not ours (never shown), one uploaded for another document or unknown,
 * one a moderator has hidden, or a size in the URL that is not the image's.
 */
export async function findImageProblems(m: EntityManager, documentId: string, content: Record<string, unknown>): Promise<ImageProblem[]> {
  const images = imagesInContent(content);
  if (!images.length) return [];
  const refs = images.map((i) => parseImageSrc(i.url));
  const ids = [...new Set(refs.filter((r) => r !== null).map((r) => r!.id))];
  const rows = ids.length ? await m.getRepository(ImageEntity).findBy({ id: In(ids) }) : [];
  const byId = new Map(rows.map((r) => [r.id, r]));
  const problems: ImageProblem[] = [];
  images.forEach((img, i) => {
    const n = `Image ${i + 1}`;
    const path = `content.${img.field}`;
    const ref = refs[i];
    if (!img.alt.trim())
      problems.push({ path, image: img.url ?? '', message: `${n} needs alt text: say what the picture shows for readers who cannot see it` });
    else if (img.alt.length > IMAGE_LIMITS.altMax)
      problems.push({ path, image: img.url ?? '', message: `${n}'s alt text is longer than ${IMAGE_LIMITS.altMax} characters` });
    if (!ref) {
      problems.push({
        path,
        image: img.url ?? '',
        message: `${n} is not an image uploaded here; only uploaded images are shown, so upload the picture instead`,
      });
      return;
    }
    const row = byId.get(ref.id);
    if (!row || row.documentId !== documentId) {
      problems.push({ path, image: img.url ?? '', message: `${n} was not uploaded to this page; upload it again here` });
      return;
    }
    if (row.hiddenAt) problems.push({ path, image: img.url ?? '', message: `${n} was hidden by a moderator; remove it` });
    if (!row.variants.some((v) => v.width === ref.width)) problems.push({ path, image: img.url ?? '', message: `${n} names a width the image does not have` });
    if (ref.original && (ref.original.width !== row.width || ref.original.height !== row.height))
      problems.push({ path, image: img.url ?? '', message: `${n}'s size (after #) is not the image's: it is ${row.width}x${row.height}` });
  });
  return problems;
}

/** Refuses the submission (422, one detail per problem) when any image in the content is not ready for readers. */
export async function assertImagesReady(m: EntityManager, documentId: string, content: Record<string, unknown>): Promise<void> {
  const problems = await findImageProblems(m, documentId, content);
  if (!problems.length) return;
  const noAlt = problems.some((p) => p.message.includes('needs alt text'));
  throw new AppError(
    422,
    'image_check_failed',
    noAlt ? 'Every image needs alt text before the draft can be submitted.' : 'Some images need attention before the draft can be submitted.',
    problems,
  );
}
